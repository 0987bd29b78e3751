import { getActor } from "@/lib/auth/session";
import { json, parseWith, readJson, route } from "@/lib/http";
import { rejectVersion } from "@/lib/services/library";
import { idParamSchema, rejectSchema } from "@/lib/validation/library";

type Context = { params: Promise<{ id: string }> };

export const POST = route<Context>(async (request, { params }) => {
  const actor = await getActor();
  const id = parseWith(idParamSchema, (await params).id);
  const { reason } = await readJson(request, rejectSchema);
  return json({ version: await rejectVersion(actor, id, reason) });
});
