import { getActor } from "@/lib/auth/session";
import { parseWith, route } from "@/lib/http";
import { revokeInvitation } from "@/lib/services/team";
import { idParamSchema } from "@/lib/validation/team";

type Context = { params: Promise<{ id: string }> };

export const DELETE = route<Context>(async (_request, { params }) => {
  await revokeInvitation(await getActor(), parseWith(idParamSchema, (await params).id));
  return new Response(null, { status: 204 });
});
