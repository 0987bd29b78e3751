import { getActor } from "@/lib/auth/session";
import { json, withId } from "@/lib/http";
import { getSpecies } from "@/lib/services/library";

export const GET = withId(async (_request, id) => json({ species: await getSpecies(await getActor(), id) }));
