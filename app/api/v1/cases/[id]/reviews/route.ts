import { getActor } from "@/lib/auth/session";
import { json, parseWith, readJson, route } from "@/lib/http";
import { decideCase, listReviews } from "@/lib/services/reviews";
import { decisionSchema } from "@/lib/validation/cases";
import { idParamSchema } from "@/lib/validation/team";

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) =>
  json({ reviews: await listReviews(await getActor(), parseWith(idParamSchema, (await params).id)) }),
);

/** Approve or return the latest snapshot; a return needs a reason. */
export const POST = route<Context>(async (request, { params }) => {
  const actor = await getActor();
  const id = parseWith(idParamSchema, (await params).id);
  return json({ case: await decideCase(actor, id, await readJson(request, decisionSchema)) }, 201);
});
