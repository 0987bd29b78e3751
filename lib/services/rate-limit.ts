import "server-only";
import { QueryTypes } from "sequelize";
import { db, models } from "@/lib/db";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";

export type Limit = { key: string; max: number };

/** Seconds until the window of `key` ends, or 0 when it is under its limit. */
async function blockedFor(limit: Limit, windowMs: number, now: Date): Promise<number> {
  const row = await models().RateLimit.findByPk(limit.key);
  if (!row) return 0;
  const ends = row.windowStartedAt.getTime() + windowMs;
  if (ends <= now.getTime() || row.count < limit.max) return 0;
  return Math.ceil((ends - now.getTime()) / 1000);
}

/** 429 with Retry-After when any of the limits is spent. */
export async function assertUnderLimits(limits: Limit[], windowSeconds = env.SIGNIN_WINDOW_SECONDS): Promise<void> {
  const now = new Date();
  let retryAfter = 0;
  for (const l of limits) retryAfter = Math.max(retryAfter, await blockedFor(l, windowSeconds * 1000, now));
  if (retryAfter > 0) {
    throw new AppError(429, "too-many-attempts", `Too many sign-in attempts. Try again in ${Math.ceil(retryAfter / 60)} minute(s).`, { retryAfterSeconds: retryAfter });
  }
}

/** Count one failure against each key; one statement per key, so concurrent servers add up correctly. */
export async function countFailure(limits: Limit[], windowSeconds = env.SIGNIN_WINDOW_SECONDS): Promise<void> {
  const now = new Date();
  const windowStart = new Date(now.getTime() - windowSeconds * 1000);
  for (const l of limits) {
    await db().query(
      `INSERT INTO rate_limits (key, count, window_started_at) VALUES (:key, 1, :now)
       ON CONFLICT (key) DO UPDATE SET
         count = CASE WHEN rate_limits.window_started_at <= :windowStart THEN 1 ELSE rate_limits.count + 1 END,
         window_started_at = CASE WHEN rate_limits.window_started_at <= :windowStart THEN :now ELSE rate_limits.window_started_at END`,
      { replacements: { key: l.key, now, windowStart }, type: QueryTypes.INSERT },
    );
  }
}

export async function clearLimits(keys: string[]): Promise<void> {
  await models().RateLimit.destroy({ where: { key: keys } });
}

export function signInLimits(email: string, address: string | null): Limit[] {
  const limits: Limit[] = [{ key: `signin:account:${email}`, max: env.SIGNIN_LIMIT_PER_ACCOUNT }];
  if (address) limits.push({ key: `signin:address:${address}`, max: env.SIGNIN_LIMIT_PER_ADDRESS });
  return limits;
}
