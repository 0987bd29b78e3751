import { getActor } from "@/lib/auth/session";
import { json, readJson, withId } from "@/lib/http";
import { editVersion, getVersion } from "@/lib/services/library";
import { deleteVersion } from "@/lib/services/library-drafts";
import { editVersionSchema } from "@/lib/validation/library";

export const GET = withId(async (_request, id) => json({ version: await getVersion(await getActor(), id) }));

/** Edit a draft; send the lockVersion you read. A stale one is answered 409 with `details.current`. */
export const PATCH = withId(async (request, id) => {
  const actor = await getActor();
  return json({ version: await editVersion(actor, id, await readJson(request, editVersionSchema)) });
});

/** Delete a draft or a proposal nothing pins (its author, or a steward); decided versions stay. */
export const DELETE = withId(async (_request, id) => json(await deleteVersion(await getActor(), id)));
