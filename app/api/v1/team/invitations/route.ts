import { getActor } from "@/lib/auth/session";
import { json, readJson, route } from "@/lib/http";
import { invite, listInvitations } from "@/lib/services/team";
import { inviteSchema } from "@/lib/validation/team";

export const GET = route(async () => json({ invitations: await listInvitations(await getActor()) }));

export const POST = route(async (request) => {
  const actor = await getActor();
  return json(await invite(actor, await readJson(request, inviteSchema)), 201);
});
