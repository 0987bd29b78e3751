import { getActor } from "@/lib/auth/session";
import { json, parseWith, queryObject, readJson, route } from "@/lib/http";
import { createSpecies, listSpecies } from "@/lib/services/library";
import { createSpeciesSchema, listSpeciesQuerySchema } from "@/lib/validation/library";

export const GET = route(async (request) => json(await listSpecies(await getActor(), parseWith(listSpeciesQuerySchema, queryObject(request)))));

export const POST = route(async (request) => {
  const actor = await getActor();
  return json({ species: await createSpecies(actor, await readJson(request, createSpeciesSchema)) }, 201);
});
