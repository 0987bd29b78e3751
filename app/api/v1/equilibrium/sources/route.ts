import { z } from "zod";
import { getActor } from "@/lib/auth/session";
import { json, readJson, route } from "@/lib/http";
import { strictObject } from "@/lib/validation/strict";
import { compareFamilies } from "@/lib/services/equilibrium";

// The rest of the body is an evaluate request, checked (strictly) by the engine. Each species entry is
// replaced by every family's approved data, so it must be empty: a field in it would be ignored.
const body = z.looseObject({ species: z.record(z.string(), strictObject({}), { error: "Send species as an object keyed by species." }) });

/** POST an evaluate request: the same request run with every approved data family that covers its species. */
export const POST = route(async (request) => json(await compareFamilies(await getActor(), () => readJson(request, body))));
