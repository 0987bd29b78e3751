import { getActor } from "@/lib/auth/session";
import { json, parseWith, readJson, route } from "@/lib/http";
import { getSpecies } from "@/lib/services/library";
import { setSpeciesCritical } from "@/lib/services/species-critical";
import { idParamSchema } from "@/lib/validation/library";
import { speciesPatchSchema } from "@/lib/validation/species-critical";

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => json({ species: await getSpecies(await getActor(), parseWith(idParamSchema, (await params).id)) }));

/** Critical constants of a team species: `{ critical: { tcK, pcBar, omega, citation } | null }`. */
export const PATCH = route<Context>(async (request, { params }) => {
  const id = parseWith(idParamSchema, (await params).id);
  return json({ species: await setSpeciesCritical(await getActor(), id, await readJson(request, speciesPatchSchema)) });
});
