import { getActor } from "@/lib/auth/session";
import { json, parseWith, readJson, route } from "@/lib/http";
import { changeRole, removeMember } from "@/lib/services/team";
import { changeRoleSchema, idParamSchema } from "@/lib/validation/team";

type Context = { params: Promise<{ id: string }> };

export const PATCH = route<Context>(async (request, { params }) => {
  const actor = await getActor();
  const id = parseWith(idParamSchema, (await params).id);
  const { role } = await readJson(request, changeRoleSchema);
  return json({ member: await changeRole(actor, id, role) });
});

export const DELETE = route<Context>(async (_request, { params }) => {
  await removeMember(await getActor(), parseWith(idParamSchema, (await params).id));
  return new Response(null, { status: 204 });
});
