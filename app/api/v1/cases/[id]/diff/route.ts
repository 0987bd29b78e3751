import { getActor } from "@/lib/auth/session";
import { json, parseWith, queryObject, withId } from "@/lib/http";
import { diffSnapshots } from "@/lib/services/cases";
import { diffQuerySchema } from "@/lib/validation/cases";

/** `?from=1&to=2`: what changed between two snapshots. */
export const GET = withId(async (request, id) => {
  const { from, to } = parseWith(diffQuerySchema, queryObject(request));
  return json({ diff: await diffSnapshots(await getActor(), id, from, to) });
});
