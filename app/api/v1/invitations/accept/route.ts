import { startSession } from "@/lib/auth/session";
import { json, readJson, route } from "@/lib/http";
import { acceptInvitation } from "@/lib/services/team";
import { acceptInvitationSchema } from "@/lib/validation/team";

export const POST = route(async (request) => {
  const { userId, teamId } = await acceptInvitation(await readJson(request, acceptInvitationSchema));
  await startSession(userId, teamId);
  return json({ userId, teamId }, 201);
});
