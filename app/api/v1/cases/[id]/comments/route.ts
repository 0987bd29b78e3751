import { getActor } from "@/lib/auth/session";
import { json, parseWith, readJson, route } from "@/lib/http";
import { addComment, listComments } from "@/lib/services/cases";
import { commentSchema } from "@/lib/validation/cases";
import { idParamSchema } from "@/lib/validation/team";

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) =>
  json({ comments: await listComments(await getActor(), parseWith(idParamSchema, (await params).id)) }),
);

export const POST = route<Context>(async (request, { params }) => {
  const actor = await getActor();
  const id = parseWith(idParamSchema, (await params).id);
  return json({ comment: await addComment(actor, id, await readJson(request, commentSchema)) }, 201);
});
