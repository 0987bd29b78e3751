import { getActor } from "@/lib/auth/session";
import { json, readJson, withId } from "@/lib/http";
import { createVersion } from "@/lib/services/library";
import { newVersionSchema } from "@/lib/validation/library";

/** A new draft: `{ fromVersionId }` starts from an existing version, or send the full version input. */
export const POST = withId(async (request, id) => {
  const actor = await getActor();
  return json({ version: await createVersion(actor, id, await readJson(request, newVersionSchema)) }, 201);
});
