import { getActor } from "@/lib/auth/session";
import { json, route } from "@/lib/http";
import { reviewQueue } from "@/lib/services/reviews";

/** Submitted cases awaiting the caller's decision (never their own). */
export const GET = route(async () => json({ cases: await reviewQueue(await getActor()) }));
