import "server-only";
import { getIronSession, unsealData, type SessionOptions } from "iron-session";
import { cookies } from "next/headers";
import { cache } from "react";
import { isProduction } from "@/lib/env";
import { resolveSessionSecret } from "@/lib/session-secret";
import { actorFor, endSessionsOf } from "@/lib/services/auth";
import type { Actor } from "./guards";
import { unsealOnce } from "./session-cache";

/** What the sealed cookie holds. `issuedAt` (ms) lets sign-out end sessions that were copied. */
export type SessionData = { userId?: number; teamId?: number; issuedAt?: number };

export const SESSION_COOKIE = "heatpath_session";

let options: SessionOptions | undefined;

/** Built on first use, so the secret is read (or, in demo mode, generated) by the running server, not by the build. */
export function sessionOptions(): SessionOptions {
  options ??= {
    password: resolveSessionSecret(),
    cookieName: SESSION_COOKIE,
    ttl: 60 * 60 * 12,
    cookieOptions: { httpOnly: true, sameSite: "lax", secure: isProduction, path: "/" },
  };
  return options;
}

export async function getSession() {
  return getIronSession<SessionData>(await cookies(), sessionOptions());
}

/** The session's data, read only: a cookie unsealed before is not unsealed again until it expires (lib/auth/session-cache.ts). */
async function readSession(): Promise<SessionData> {
  const seal = (await cookies()).get(SESSION_COOKIE)?.value;
  if (!seal) return {};
  const { password, ttl } = sessionOptions();
  return unsealOnce(seal, (s) => unsealData<SessionData>(s, { password, ttl }));
}

/**
 * The signed-in actor, or null (no cookie, or a session ended by sign-out). Services decide what null means.
 * Asked once per server render (React's `cache`), so a page and its layout share one lookup; outside a
 * render (route handlers, server actions, tests) every call reads the cookie afresh.
 */
export const getActor = cache(async (): Promise<Actor | null> => {
  const session = await readSession();
  if (!session.userId) return null;
  return actorFor(session.userId, session.teamId, session.issuedAt ?? 0);
});

/** A new sealed cookie at every sign-in: nothing of an earlier session carries over. */
export async function startSession(userId: number, teamId: number): Promise<void> {
  const session = await getSession();
  session.destroy();
  const fresh = await getSession();
  fresh.userId = userId;
  fresh.teamId = teamId;
  fresh.issuedAt = Date.now();
  await fresh.save();
}

/**
 * Clear the cookie and refuse every session of this account issued until now,
 * so a copy of the cookie is worthless after sign-out (on every device).
 */
export async function endSession(): Promise<void> {
  const session = await getSession();
  if (session.userId) await endSessionsOf(session.userId);
  session.destroy();
}
