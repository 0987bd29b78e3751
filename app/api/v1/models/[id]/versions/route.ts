import { getActor } from "@/lib/auth/session";
import { json, parseWith, readJson, route } from "@/lib/http";
import { createVersion } from "@/lib/services/library";
import { idParamSchema, newVersionSchema } from "@/lib/validation/library";

type Context = { params: Promise<{ id: string }> };

/** A new draft: `{ fromVersionId }` starts from an existing version, or send the full version input. */
export const POST = route<Context>(async (request, { params }) => {
  const actor = await getActor();
  const id = parseWith(idParamSchema, (await params).id);
  return json({ version: await createVersion(actor, id, await readJson(request, newVersionSchema)) }, 201);
});
