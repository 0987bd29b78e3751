import { z } from "zod";
import { strictObject } from "@/lib/validation/strict";
import { oneLine } from "./text";
import { ROLES } from "@/lib/auth/permissions";
import { emailSchema, newPasswordSchema } from "./auth";

export const roleSchema = z.enum(ROLES, { error: "Choose one of: engineer, steward, reviewer, admin." });

export const changeRoleSchema = strictObject({ role: roleSchema });

export const inviteSchema = strictObject({ email: emailSchema, role: roleSchema });
export type InviteInput = z.infer<typeof inviteSchema>;

export const acceptInvitationSchema = strictObject({
  token: z.string().min(20, "This invitation link is incomplete.").max(200, "This invitation link is malformed."),
  name: oneLine(z.string({ error: "Enter your name." }).trim().min(1, "Enter your name.").max(120, "Use at most 120 characters.")),
  password: newPasswordSchema,
});
export type AcceptInvitationInput = z.infer<typeof acceptInvitationSchema>;
