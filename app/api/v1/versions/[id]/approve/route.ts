import { getActor } from "@/lib/auth/session";
import { json, readJson, withId } from "@/lib/http";
import { approveVersion } from "@/lib/services/library";
import { approveSchema } from "@/lib/validation/library";

export const POST = withId(async (request, id) => {
  const actor = await getActor();
  const body = request.headers.get("content-type") ? await readJson(request, approveSchema) : {};
  return json({ version: await approveVersion(actor, id, body.note) });
});
