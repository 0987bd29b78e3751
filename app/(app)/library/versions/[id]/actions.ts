"use server";

import { revalidatePath } from "next/cache";
import { actionFailure, formObject, type ActionState } from "@/lib/actions";
import { getActor } from "@/lib/auth/session";
import { parseWith } from "@/lib/http";
import { approveVersion, rejectVersion } from "@/lib/services/library";
import { approveSchema, idParamSchema, rejectSchema } from "@/lib/validation/library";

/**
 * The version page's decision buttons. The service applies the four-eyes rule
 * (nobody who changed or proposed the version decides), exactly as for the API.
 */
export async function approveVersionAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  const raw = formObject(formData);
  try {
    const { versionId, ...rest } = raw;
    const id = parseWith(idParamSchema, versionId);
    const { note } = parseWith(approveSchema.strict(), rest);
    await approveVersion(await getActor(), id, note);
    revalidatePath(`/library/versions/${id}`);
    return { ok: true, message: "Approved." };
  } catch (error) {
    return actionFailure(error, raw);
  }
}

export async function rejectVersionAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  const raw = formObject(formData);
  try {
    const { versionId, ...rest } = raw;
    const id = parseWith(idParamSchema, versionId);
    const { reason } = parseWith(rejectSchema.strict(), rest);
    await rejectVersion(await getActor(), id, reason);
    revalidatePath(`/library/versions/${id}`);
    return { ok: true, message: "Rejected." };
  } catch (error) {
    return actionFailure(error, raw);
  }
}
