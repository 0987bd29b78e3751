import { z } from "zod";
import { getActor } from "@/lib/auth/session";
import { json, readJson, route } from "@/lib/http";
import { compareFamilies } from "@/lib/services/equilibrium";

const body = z.looseObject({ species: z.record(z.string(), z.unknown(), { error: "Send species as an object keyed by species." }) });

/** POST an evaluate request: the same request run with every approved data family that covers its species. */
export const POST = route(async (request) => json(await compareFamilies(await getActor(), () => readJson(request, body))));
