import { ZodError } from "zod";
import { AppError } from "@/lib/errors";
import { fieldErrors } from "@/lib/http";
import { UNKNOWN_FIELD } from "@/lib/validation/strict";

/** What every server action returns to useActionState. */
export type ActionState<T = undefined> = {
  ok: boolean;
  message?: string;
  fieldErrors?: Record<string, string>;
  /** The HTTP status the same refusal would get from the API (401, 403, 404, 409, 422…). */
  status?: number;
  /** What was typed, so a refused form shows it again (React resets forms after an action). Never passwords. */
  values?: Record<string, string>;
  data?: T;
};

/** A server action as useActionState takes it; a page passes its actions to the form components as props. */
export type FormAction<T = undefined> = (prev: ActionState<T>, formData: FormData) => Promise<ActionState<T>>;

export const initialActionState: ActionState = { ok: false };

/** Expected failures become a message for the form; anything else is rethrown to the error page. */
export function actionFailure(error: unknown, values?: Record<string, string>): ActionState<never> {
  const kept = values ? keepable(values) : undefined;
  if (error instanceof AppError) {
    const fields = (error.details as { fields?: Record<string, string> } | undefined)?.fields;
    // A form shows validation failures beside their fields, not again in a banner.
    // A field the form does not have (a crafted or stale form) has no place to show beside: say it in the banner.
    const unknown = fields && Object.values(fields).find((m) => m.startsWith(UNKNOWN_FIELD));
    if (fields) return { ok: false, status: error.status, fieldErrors: fields, ...(unknown ? { message: error.message } : {}), values: kept };
    return { ok: false, status: error.status, message: error.message, values: kept };
  }
  if (error instanceof ZodError) return { ok: false, status: 422, fieldErrors: fieldErrors(error), message: unknownFieldMessage(error), values: kept };
  throw error;
}

function keepable(values: Record<string, string>): Record<string, string> {
  return Object.fromEntries(Object.entries(values).filter(([k]) => !/password|token/i.test(k)));
}

/** The message of the first unknown-field issue (strict objects), for the form's banner. */
export function unknownFieldMessage(error: ZodError): string | undefined {
  return error.issues.find((i) => i.code === "unrecognized_keys")?.message;
}

export function formObject(formData: FormData): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [k, v] of formData.entries()) if (typeof v === "string" && !k.startsWith("$ACTION")) out[k] = v;
  return out;
}
