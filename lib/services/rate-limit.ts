import "server-only";
import { QueryTypes, type Transaction } from "sequelize";
import { db, models } from "@/lib/db";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";

export type Limit = { key: string; max: number };

const tooMany = (retryAfter: number) =>
  new AppError(429, "too-many-attempts", `Too many sign-in attempts. Try again in ${Math.ceil(retryAfter / 60)} minute(s).`, { retryAfterSeconds: retryAfter });

async function bump(l: Limit, now: Date, windowStart: Date, transaction: Transaction): Promise<number> {
  await db().query(
    `INSERT INTO rate_limits (key, count, window_started_at) VALUES (:key, 1, :now)
     ON CONFLICT (key) DO UPDATE SET
       count = CASE WHEN rate_limits.window_started_at <= :windowStart THEN 1 ELSE rate_limits.count + 1 END,
       window_started_at = CASE WHEN rate_limits.window_started_at <= :windowStart THEN :now ELSE rate_limits.window_started_at END`,
    { replacements: { key: l.key, now, windowStart }, type: QueryTypes.INSERT, transaction },
  );
  // Same transaction, so this is the count this attempt made.
  const rows = await db().query<{ count: number | string }>(`SELECT count FROM rate_limits WHERE key = :key`, {
    replacements: { key: l.key },
    type: QueryTypes.SELECT,
    transaction,
  });
  return Number(rows[0].count);
}

/**
 * Take one attempt from every limit before the password is checked, in one IMMEDIATE
 * transaction (SQLite's write lock; a row lock per key on PostgreSQL), so that however many
 * attempts arrive at once, at most `max` per key are ever evaluated. An attempt over any limit
 * is refused with 429 and Retry-After and counts nowhere (the transaction rolls back).
 * A successful sign-in gives its attempt back with `releaseAttempt`.
 */
export async function takeAttempt(limits: Limit[], windowSeconds = env.SIGNIN_WINDOW_SECONDS): Promise<void> {
  const now = new Date();
  const windowStart = new Date(now.getTime() - windowSeconds * 1000);
  const over: Limit[] = [];
  try {
    await db().transaction(async (transaction) => {
      for (const l of limits) if ((await bump(l, now, windowStart, transaction)) > l.max) over.push(l);
      if (over.length) throw tooMany(0);
    });
  } catch (error) {
    if (!(error instanceof AppError) || error.status !== 429) throw error;
    let retryAfter = 1;
    for (const l of over) {
      const row = await models().RateLimit.findByPk(l.key);
      if (row) retryAfter = Math.max(retryAfter, Math.ceil((row.windowStartedAt.getTime() + windowSeconds * 1000 - now.getTime()) / 1000));
    }
    throw tooMany(retryAfter);
  }
}

/** After a successful sign-in: the account + address counter starts again; the wider counters get this attempt back. */
export async function releaseAttempt(limits: Limit[], resetKeys: string[]): Promise<void> {
  await db().transaction(async (transaction) => {
    await models().RateLimit.destroy({ where: { key: resetKeys }, transaction });
    const others = limits.map((l) => l.key).filter((k) => !resetKeys.includes(k));
    if (others.length) {
      await db().query(`UPDATE rate_limits SET count = CASE WHEN count > 0 THEN count - 1 ELSE 0 END WHERE key IN (:others)`, {
        replacements: { others },
        transaction,
      });
    }
  });
}

/**
 * The sign-in limits: per account from one address (SIGNIN_LIMIT_PER_ACCOUNT), so a stranger's
 * wrong passwords do not lock the owner out from their own address; per account from all
 * addresses (SIGNIN_CEILING_PER_ACCOUNT, much higher, against a spread-out guessing run); per
 * address across accounts (SIGNIN_LIMIT_PER_ADDRESS). An unknown address counts as one address.
 */
export function signInLimits(email: string, address: string | null): Limit[] {
  const from = address ?? "unknown";
  return [
    { key: `signin:account-address:${email}|${from}`, max: env.SIGNIN_LIMIT_PER_ACCOUNT },
    { key: `signin:account:${email}`, max: env.SIGNIN_CEILING_PER_ACCOUNT },
    { key: `signin:address:${from}`, max: env.SIGNIN_LIMIT_PER_ADDRESS },
  ];
}
