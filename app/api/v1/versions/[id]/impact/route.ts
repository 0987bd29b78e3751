import { getActor } from "@/lib/auth/session";
import { json, parseWith, route } from "@/lib/http";
import { getImpact, startImpact } from "@/lib/services/impact";
import { idParamSchema } from "@/lib/validation/library";

type Context = { params: Promise<{ id: string }> };

/** The latest impact run of this version on the team's pinned cases (`job: null` before the first). */
export const GET = route<Context>(async (_request, { params }) => {
  const actor = await getActor();
  const id = parseWith(idParamSchema, (await params).id);
  return json(await getImpact(actor, id));
});

/** Queue a run (202); while one is queued or running, that one is returned. */
export const POST = route<Context>(async (_request, { params }) => {
  const actor = await getActor();
  const id = parseWith(idParamSchema, (await params).id);
  return json(await startImpact(actor, id), 202);
});
