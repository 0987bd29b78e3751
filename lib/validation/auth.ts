import { z } from "zod";
import { strictObject } from "@/lib/validation/strict";
import { PASSWORD_MIN_LENGTH } from "@/lib/auth/password";

export const emailSchema = z
  .string({ error: "Enter an e-mail address." })
  .trim()
  .toLowerCase()
  .min(1, "Enter an e-mail address.")
  .max(254, "That e-mail address is too long.")
  .pipe(z.email({ error: "Enter a valid e-mail address." }));

export const signInSchema = strictObject({
  email: emailSchema,
  password: z.string({ error: "Enter your password." }).min(1, "Enter your password.").max(200, "That password is too long."),
});
export type SignInInput = z.infer<typeof signInSchema>;

export const newPasswordSchema = z
  .string({ error: "Choose a password." })
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters.`)
  .max(200, "Use at most 200 characters.")
  .refine((p) => /[a-z]/i.test(p) && /[^a-z]/i.test(p), "Mix letters with at least one digit or symbol.");
