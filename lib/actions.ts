import { ZodError } from "zod";
import { AppError } from "@/lib/errors";
import { fieldErrors } from "@/lib/http";

/** What every server action returns to useActionState. */
export type ActionState<T = undefined> = { ok: boolean; message?: string; fieldErrors?: Record<string, string>; data?: T };

export const initialActionState: ActionState = { ok: false };

/** Expected failures become a message for the form; anything else is rethrown to the error page. */
export function actionFailure(error: unknown): ActionState<never> {
  if (error instanceof AppError) return { ok: false, message: error.message, fieldErrors: (error.details as { fields?: Record<string, string> })?.fields };
  if (error instanceof ZodError) return { ok: false, message: "Some fields need attention.", fieldErrors: fieldErrors(error) };
  throw error;
}

export function formObject(formData: FormData): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [k, v] of formData.entries()) if (typeof v === "string" && !k.startsWith("$ACTION")) out[k] = v;
  return out;
}
