import { getActor } from "@/lib/auth/session";
import { json, parseWith, readJson, route } from "@/lib/http";
import { approveVersion } from "@/lib/services/library";
import { approveSchema, idParamSchema } from "@/lib/validation/library";

type Context = { params: Promise<{ id: string }> };

export const POST = route<Context>(async (request, { params }) => {
  const actor = await getActor();
  const id = parseWith(idParamSchema, (await params).id);
  const body = request.headers.get("content-type") ? await readJson(request, approveSchema) : {};
  return json({ version: await approveVersion(actor, id, body.note) });
});
