import { BoundedLru } from "@/lib/lru";

/**
 * Session cookies this process has already unsealed. Unsealing (iron: two key derivations, an
 * HMAC check and a decryption, each a round trip to the crypto thread pool) was the larger
 * part of what a signed-in API request costs before its own work. A sealed cookie's content
 * never changes, so once iron has accepted a seal its data is kept, keyed by the exact sealed
 * string, until the seal's own expiry; any other string (tampered, re-sealed, expired) is
 * unsealed by iron as before. What the session *may do* is not cached: `getActor` still loads
 * the member, team, role and sign-out time from the database on every request.
 */

type Unsealed = { data: Record<string, unknown>; expiresAtMs: number; weight: number };

/** Seals kept per process (a few hundred bytes each). */
export const MAX_UNSEALED_SESSIONS = 4096;

type Holder = { __heatpathUnsealedSessions?: BoundedLru<Unsealed> };
const holder = globalThis as Holder;

/** One per process, kept on globalThis because Next bundles each route separately. */
export function unsealedSessions(): BoundedLru<Unsealed> {
  holder.__heatpathUnsealedSessions ??= new BoundedLru<Unsealed>(MAX_UNSEALED_SESSIONS);
  return holder.__heatpathUnsealedSessions;
}

/** The expiry (ms since the epoch) an iron seal carries, `Fe26.2*id*salt*iv*data*expiration*hmacSalt*hmac[~version]`; null when it has none. */
export function sealExpiry(seal: string): number | null {
  const expiration = seal.split("~")[0].split("*")[5];
  return expiration && /^\d+$/.test(expiration) ? Number(expiration) : null;
}

/**
 * `unseal(seal)`, or what it answered for this very seal before while the seal has not expired
 * (kept only when it answered a session; a refused seal is asked again). Each caller gets its
 * own copy of the data.
 */
export async function unsealOnce<T extends object>(seal: string, unseal: (seal: string) => Promise<T>, now: number = Date.now()): Promise<T> {
  const cache = unsealedSessions();
  const hit = cache.get(seal);
  if (hit && now < hit.expiresAtMs) return { ...hit.data } as T;
  if (hit) cache.delete(seal);
  const data = await unseal(seal);
  const expiresAtMs = sealExpiry(seal);
  // iron itself accepts a seal until a minute past its expiry; the cache stops at the expiry.
  if (expiresAtMs !== null && now < expiresAtMs && Object.keys(data).length > 0) cache.set(seal, { data: { ...(data as Record<string, unknown>) }, expiresAtMs, weight: 1 });
  return data;
}
