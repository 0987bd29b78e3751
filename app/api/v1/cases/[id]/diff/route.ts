import { getActor } from "@/lib/auth/session";
import { json, parseWith, queryObject, route } from "@/lib/http";
import { diffSnapshots } from "@/lib/services/cases";
import { diffQuerySchema } from "@/lib/validation/cases";
import { idParamSchema } from "@/lib/validation/team";

type Context = { params: Promise<{ id: string }> };

/** `?from=1&to=2`: what changed between two snapshots. */
export const GET = route<Context>(async (request, { params }) => {
  const id = parseWith(idParamSchema, (await params).id);
  const { from, to } = parseWith(diffQuerySchema, queryObject(request));
  return json({ diff: await diffSnapshots(await getActor(), id, from, to) });
});
