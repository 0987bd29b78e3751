import { getActor } from "@/lib/auth/session";
import { json, parseWith, readJson, route } from "@/lib/http";
import { submitCase } from "@/lib/services/cases";
import { lockSchema } from "@/lib/validation/cases";
import { idParamSchema } from "@/lib/validation/team";

type Context = { params: Promise<{ id: string }> };

export const POST = route<Context>(async (request, { params }) => {
  const actor = await getActor();
  const id = parseWith(idParamSchema, (await params).id);
  const { lockVersion } = await readJson(request, lockSchema);
  return json({ case: await submitCase(actor, id, lockVersion) });
});
