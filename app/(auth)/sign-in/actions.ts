"use server";

import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { actionFailure, formObject, type ActionState } from "@/lib/actions";
import { clientAddress, safeNext } from "@/lib/auth/client";
import { startSession } from "@/lib/auth/session";
import { fieldErrors } from "@/lib/http";
import { authenticate } from "@/lib/services/auth";
import { signInSchema } from "@/lib/validation/auth";


export async function signInAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  const input = formObject(formData);
  const parsed = signInSchema.safeParse(input);
  if (!parsed.success) return { ok: false, status: 422, fieldErrors: fieldErrors(parsed.error), values: { email: input.email ?? "" } };
  try {
    const { userId, teamId } = await authenticate(parsed.data, { clientAddress: clientAddress(await headers()) });
    await startSession(userId, teamId);
  } catch (error) {
    return actionFailure(error, { email: input.email ?? "" });
  }
  redirect(safeNext(input.next));
}
