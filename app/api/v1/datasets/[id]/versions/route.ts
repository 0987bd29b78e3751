import { getActor } from "@/lib/auth/session";
import { json, parseWith, readJson, route } from "@/lib/http";
import { saveFitAsDraft } from "@/lib/services/datasets";
import { idParamSchema, saveFitSchema } from "@/lib/validation/library";

type Context = { params: Promise<{ id: string }> };

/** Save a fit of this dataset as a draft version (of a new team model unless modelId is given). */
export const POST = route<Context>(async (request, { params }) => {
  const actor = await getActor();
  const id = parseWith(idParamSchema, (await params).id);
  return json({ version: await saveFitAsDraft(actor, id, await readJson(request, saveFitSchema)) }, 201);
});
