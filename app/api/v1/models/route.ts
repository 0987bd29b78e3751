import { getActor } from "@/lib/auth/session";
import { json, parseWith, queryObject, readJson, route } from "@/lib/http";
import { createModel, listModels } from "@/lib/services/library";
import { createModelSchema, listModelsQuerySchema } from "@/lib/validation/library";

export const GET = route(async (request) => json(await listModels(await getActor(), parseWith(listModelsQuerySchema, queryObject(request)))));

export const POST = route(async (request) => {
  const actor = await getActor();
  return json(await createModel(actor, await readJson(request, createModelSchema)), 201);
});
