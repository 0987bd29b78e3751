import { getActor } from "@/lib/auth/session";
import { json, parseWith, readJson, route } from "@/lib/http";
import { editVersion, getVersion } from "@/lib/services/library";
import { deleteVersion } from "@/lib/services/library-drafts";
import { editVersionSchema, idParamSchema } from "@/lib/validation/library";

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => json({ version: await getVersion(await getActor(), parseWith(idParamSchema, (await params).id)) }));

/** Edit a draft; send the lockVersion you read. A stale one is answered 409 with `details.current`. */
export const PATCH = route<Context>(async (request, { params }) => {
  const actor = await getActor();
  const id = parseWith(idParamSchema, (await params).id);
  return json({ version: await editVersion(actor, id, await readJson(request, editVersionSchema)) });
});

/** Delete a draft or a proposal nothing pins (its author, or a steward); decided versions stay. */
export const DELETE = route<Context>(async (_request, { params }) => json(await deleteVersion(await getActor(), parseWith(idParamSchema, (await params).id))));
