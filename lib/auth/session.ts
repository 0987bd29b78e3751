import "server-only";
import { getIronSession, type SessionOptions } from "iron-session";
import { cookies } from "next/headers";
import { env, isProduction } from "@/lib/env";
import { actorFor } from "@/lib/services/auth";
import type { Actor } from "./guards";

export type SessionData = { userId?: number; teamId?: number };

export const SESSION_COOKIE = "heatpath_session";

export const sessionOptions: SessionOptions = {
  password: env.SESSION_SECRET,
  cookieName: SESSION_COOKIE,
  ttl: 60 * 60 * 12,
  cookieOptions: { httpOnly: true, sameSite: "lax", secure: isProduction, path: "/" },
};

export async function getSession() {
  return getIronSession<SessionData>(await cookies(), sessionOptions);
}

/** The signed-in actor, or null. Services decide what null means. */
export async function getActor(): Promise<Actor | null> {
  const session = await getSession();
  if (!session.userId) return null;
  return actorFor(session.userId, session.teamId);
}

export async function startSession(userId: number, teamId: number): Promise<void> {
  const session = await getSession();
  session.destroy();
  const fresh = await getSession();
  fresh.userId = userId;
  fresh.teamId = teamId;
  await fresh.save();
}

export async function endSession(): Promise<void> {
  const session = await getSession();
  session.destroy();
}
