import { getActor } from "@/lib/auth/session";
import { json, readJson, withId } from "@/lib/http";
import { saveFitAsDraft } from "@/lib/services/datasets";
import { saveFitSchema } from "@/lib/validation/library";

/** Save a fit of this dataset as a draft version (of a new team model unless modelId is given). */
export const POST = withId(async (request, id) => {
  const actor = await getActor();
  return json({ version: await saveFitAsDraft(actor, id, await readJson(request, saveFitSchema)) }, 201);
});
