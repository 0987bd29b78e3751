import { z } from "zod";
import { strictObject } from "@/lib/validation/strict";
import { getActor } from "@/lib/auth/session";
import { json, parseWith, queryObject, withId } from "@/lib/http";
import { versionCurve } from "@/lib/services/library";
import { aboveZeroKSentence } from "@/lib/thermo/scales";

const query = strictObject({
  fromK: z.coerce.number().positive(aboveZeroKSentence()).optional(),
  toK: z.coerce.number().positive(aboveZeroKSentence()).optional(),
  points: z.coerce.number().int().min(2).max(400).optional(),
});

/** Cp, H, S and G of a saved version on a grid, with its chains' validity ranges. */
export const GET = withId(async (request, id) => {
  const actor = await getActor();
  return json(await versionCurve(actor, id, parseWith(query, queryObject(request))));
});
