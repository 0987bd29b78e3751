import { getActor } from "@/lib/auth/session";
import { json, withId } from "@/lib/http";
import { getImpact, startImpact } from "@/lib/services/impact";

/** The latest impact run of this version on the team's pinned cases (`job: null` before the first). */
export const GET = withId(async (_request, id) => {
  const actor = await getActor();
  return json(await getImpact(actor, id));
});

/** Queue a run (202); while one is queued or running, that one is returned. */
export const POST = withId(async (_request, id) => {
  const actor = await getActor();
  return json(await startImpact(actor, id), 202);
});
