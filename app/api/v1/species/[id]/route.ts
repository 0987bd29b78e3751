import { getActor } from "@/lib/auth/session";
import { json, readJson, withId } from "@/lib/http";
import { getSpecies } from "@/lib/services/library";
import { getSpeciesCritical, setSpeciesCritical } from "@/lib/services/species-critical";
import { speciesPatchSchema } from "@/lib/validation/species-critical";

export const GET = withId(async (_request, id) => {
  const actor = await getActor();
  return json({ species: await getSpecies(actor, id), critical: await getSpeciesCritical(actor, id) });
});

/** Critical constants of a team species: `{ critical: { tcK, pcBar, omega, citation } | null }`. */
export const PATCH = withId(async (request, id) => json({ critical: await setSpeciesCritical(await getActor(), id, await readJson(request, speciesPatchSchema)) }));
