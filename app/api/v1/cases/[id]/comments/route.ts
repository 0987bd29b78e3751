import { getActor } from "@/lib/auth/session";
import { json, readJson, withId } from "@/lib/http";
import { addComment, listComments } from "@/lib/services/cases";
import { commentSchema } from "@/lib/validation/cases";

export const GET = withId(async (_request, id) => json({ comments: await listComments(await getActor(), id) }));

export const POST = withId(async (request, id) => {
  const actor = await getActor();
  return json({ comment: await addComment(actor, id, await readJson(request, commentSchema)) }, 201);
});
