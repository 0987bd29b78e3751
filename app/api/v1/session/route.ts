import { clientAddress } from "@/lib/auth/client";
import { endSession, startSession } from "@/lib/auth/session";
import { json, readJson, route } from "@/lib/http";
import { actorFor, authenticate, toMe } from "@/lib/services/auth";
import { signInSchema } from "@/lib/validation/auth";

/** Sign in for scripts and API clients; the sign-in page uses a server action. */
export const POST = route(async (request) => {
  const input = await readJson(request, signInSchema);
  const { userId, teamId } = await authenticate(input, { clientAddress: clientAddress(request.headers) });
  await startSession(userId, teamId);
  return json(toMe((await actorFor(userId, teamId))!));
});

export const DELETE = route(async () => {
  await endSession();
  return new Response(null, { status: 204 });
});
