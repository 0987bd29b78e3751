import { getActor } from "@/lib/auth/session";
import { withId } from "@/lib/http";
import { revokeInvitation } from "@/lib/services/team";

export const DELETE = withId(async (_request, id) => {
  await revokeInvitation(await getActor(), id);
  return new Response(null, { status: 204 });
});
