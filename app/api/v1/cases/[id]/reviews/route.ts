import { getActor } from "@/lib/auth/session";
import { json, readJson, withId } from "@/lib/http";
import { decideCase, listReviews } from "@/lib/services/reviews";
import { decisionSchema } from "@/lib/validation/cases";

export const GET = withId(async (_request, id) => json({ reviews: await listReviews(await getActor(), id) }));

/** Approve or return the latest snapshot; a return needs a reason. */
export const POST = withId(async (request, id) => {
  const actor = await getActor();
  return json({ case: await decideCase(actor, id, await readJson(request, decisionSchema)) }, 201);
});
