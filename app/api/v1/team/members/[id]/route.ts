import { getActor } from "@/lib/auth/session";
import { json, readJson, withId } from "@/lib/http";
import { changeRole, removeMember } from "@/lib/services/team";
import { changeRoleSchema } from "@/lib/validation/team";

export const PATCH = withId(async (request, id) => {
  const actor = await getActor();
  const { role } = await readJson(request, changeRoleSchema);
  return json({ member: await changeRole(actor, id, role) });
});

export const DELETE = withId(async (_request, id) => {
  await removeMember(await getActor(), id);
  return new Response(null, { status: 204 });
});
