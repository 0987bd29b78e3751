import { getActor } from "@/lib/auth/session";
import { json, readJson, withId } from "@/lib/http";
import { rejectVersion } from "@/lib/services/library";
import { rejectSchema } from "@/lib/validation/library";

export const POST = withId(async (request, id) => {
  const actor = await getActor();
  const { reason } = await readJson(request, rejectSchema);
  return json({ version: await rejectVersion(actor, id, reason) });
});
