"use server";

import { revalidatePath } from "next/cache";
import { actionFailure, formObject, type ActionState } from "@/lib/actions";
import { getActor } from "@/lib/auth/session";
import { parseWith } from "@/lib/http";
import { approveVersion, rejectVersion } from "@/lib/services/library";
import { z } from "zod";
import { approveSchema, rejectSchema } from "@/lib/validation/library";
import { idParamSchema } from "@/lib/validation/params";

/** The forms' fields: the version id beside the decision's own; anything else is refused. */
const versionField = { versionId: z.string({ error: "Expected a numeric id." }) };

/**
 * The version page's decision buttons. The service applies the four-eyes rule
 * (nobody who changed or proposed the version decides), exactly as for the API.
 */
export async function approveVersionAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  const raw = formObject(formData);
  try {
    const { versionId, note } = parseWith(approveSchema.extend(versionField), raw);
    const id = parseWith(idParamSchema, versionId);
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
    const { versionId, reason } = parseWith(rejectSchema.extend(versionField), raw);
    const id = parseWith(idParamSchema, versionId);
    await rejectVersion(await getActor(), id, reason);
    revalidatePath(`/library/versions/${id}`);
    return { ok: true, message: "Rejected." };
  } catch (error) {
    return actionFailure(error, raw);
  }
}
