import "server-only";
import { Op } from "sequelize";
import { db, models } from "@/lib/db";

/**
 * Due mail older than this means no app server's worker is claiming it (the
 * longest retry pause is 5 minutes, and a worker polls every few seconds).
 */
export const MAIL_QUEUE_LIMIT_SECONDS = 600;
/** A database that does not answer `SELECT 1` within this is reported down. */
const DATABASE_TIMEOUT_MS = 2_000;

export type DeepHealthDto = {
  status: "ok" | "degraded" | "unavailable";
  database: { ok: boolean; ms: number | null };
  mailQueue: { ok: boolean; due: number | null; oldestDueSeconds: number | null; limitSeconds: number };
};

function withTimeout<T>(promise: Promise<T>, ms: number): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new Error("timed out")), ms);
  });
  return Promise.race([promise, timeout]).finally(() => clearTimeout(timer));
}

/**
 * What a load balancer and a monitor ask of one app server: can it reach the
 * database, and is the shared mail queue moving. Public, like the shallow
 * check; it says nothing about teams, addresses or errors.
 * - database down: `unavailable` (the route answers 503: take this server out);
 * - due mail waiting longer than the limit: `degraded` (200: the server still
 *   serves; every server shares the queue, so alert rather than drain them all).
 */
export async function deepHealth(now = new Date()): Promise<DeepHealthDto> {
  const started = performance.now();
  let databaseOk = true;
  try {
    await withTimeout(db().query("SELECT 1"), DATABASE_TIMEOUT_MS);
  } catch {
    databaseOk = false;
  }
  const database = { ok: databaseOk, ms: databaseOk ? Math.round((performance.now() - started) * 10) / 10 : null };
  const mailQueue: DeepHealthDto["mailQueue"] = { ok: false, due: null, oldestDueSeconds: null, limitSeconds: MAIL_QUEUE_LIMIT_SECONDS };
  if (databaseOk) {
    try {
      const { MailMessage } = models();
      const where = { status: { [Op.in]: ["queued", "sending"] }, nextAttemptAt: { [Op.lte]: now } };
      const [due, oldest] = await withTimeout(
        Promise.all([MailMessage.count({ where }), MailMessage.min<Date | string | null, InstanceType<typeof MailMessage>>("nextAttemptAt", { where })]),
        DATABASE_TIMEOUT_MS,
      );
      const oldestMs = oldest === null || oldest === undefined ? null : new Date(oldest).getTime();
      mailQueue.due = Number(due);
      mailQueue.oldestDueSeconds = oldestMs === null ? 0 : Math.max(0, Math.round((now.getTime() - oldestMs) / 1000));
      mailQueue.ok = mailQueue.oldestDueSeconds <= MAIL_QUEUE_LIMIT_SECONDS;
    } catch {
      mailQueue.ok = false;
    }
  }
  const status = !database.ok ? "unavailable" : mailQueue.ok ? "ok" : "degraded";
  return { status, database, mailQueue };
}
