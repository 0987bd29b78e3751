import { getActor } from "@/lib/auth/session";
import { json, parseWith, readJson, route } from "@/lib/http";
import { getSpecies } from "@/lib/services/library";
import { getSpeciesCritical, setSpeciesCritical } from "@/lib/services/species-critical";
import { idParamSchema } from "@/lib/validation/library";
import { speciesPatchSchema } from "@/lib/validation/species-critical";

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => {
  const actor = await getActor();
  const id = parseWith(idParamSchema, (await params).id);
  return json({ species: await getSpecies(actor, id), critical: await getSpeciesCritical(actor, id) });
});

/** Critical constants of a team species: `{ critical: { tcK, pcBar, omega, citation } | null }`. */
export const PATCH = route<Context>(async (request, { params }) => {
  const id = parseWith(idParamSchema, (await params).id);
  return json({ critical: await setSpeciesCritical(await getActor(), id, await readJson(request, speciesPatchSchema)) });
});
