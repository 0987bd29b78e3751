"use server";

import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { actionFailure, formObject, unknownFieldMessage, type ActionState } from "@/lib/actions";
import { clientAddress } from "@/lib/auth/client";
import { safeNext } from "@/lib/auth/safe-next";
import { startSession } from "@/lib/auth/session";
import { fieldErrors } from "@/lib/http";
import { authenticate } from "@/lib/services/auth";
import { z } from "zod";
import { signInSchema } from "@/lib/validation/auth";

/** The form: the sign-in fields plus where to go next; anything else is refused. */
const signInForm = signInSchema.extend({ next: z.string().max(2000).optional() });

export async function signInAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  const input = formObject(formData);
  const parsed = signInForm.safeParse(input);
  if (!parsed.success) return { ok: false, status: 422, fieldErrors: fieldErrors(parsed.error), message: unknownFieldMessage(parsed.error), values: { email: input.email ?? "" } };
  try {
    const { next: _next, ...credentials } = parsed.data;
    const { userId, teamId } = await authenticate(credentials, { clientAddress: clientAddress(await headers()) });
    await startSession(userId, teamId);
  } catch (error) {
    return actionFailure(error, { email: input.email ?? "" });
  }
  redirect(safeNext(input.next));
}
