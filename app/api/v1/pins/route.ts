import { getActor } from "@/lib/auth/session";
import { json, parseWith, queryObject, route } from "@/lib/http";
import { listPinOptions } from "@/lib/services/pins";
import { pinQuerySchema } from "@/lib/validation/cases";

/** Model versions a case may pin (`?formula=H2O`); approved first, others carry a warning. */
export const GET = route(async (request) => {
  const { formula } = parseWith(pinQuerySchema, queryObject(request));
  return json({ versions: await listPinOptions(await getActor(), { formula }) });
});
