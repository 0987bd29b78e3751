"use server";

import { revalidatePath } from "next/cache";
import { actionFailure, formObject, type ActionState } from "@/lib/actions";
import { getActor } from "@/lib/auth/session";
import { parseWith } from "@/lib/http";
import { setSpeciesCritical } from "@/lib/services/species-critical";
import { idParamSchema } from "@/lib/validation/params";
import { criticalFormSchema, criticalRemoveFormSchema } from "@/lib/validation/species-critical";

/** The species page's critical-constants form; the service checks role and team, as for the API. */
export async function saveCriticalAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  const raw = formObject(formData);
  try {
    const { speciesId, ...critical } = parseWith(criticalFormSchema, raw);
    const id = parseWith(idParamSchema, speciesId);
    await setSpeciesCritical(await getActor(), id, { critical });
    revalidatePath(`/library/species/${id}`);
    return { ok: true, message: "Critical constants saved." };
  } catch (error) {
    return actionFailure(error, raw);
  }
}

export async function removeCriticalAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  const raw = formObject(formData);
  try {
    const id = parseWith(idParamSchema, parseWith(criticalRemoveFormSchema, raw).speciesId);
    await setSpeciesCritical(await getActor(), id, { critical: null });
    revalidatePath(`/library/species/${id}`);
    return { ok: true, message: "Critical constants removed." };
  } catch (error) {
    return actionFailure(error, raw);
  }
}
