import "server-only";
import crypto from "node:crypto";
import { QueryTypes, type Transaction } from "sequelize";
import type { Transporter } from "nodemailer";
import { requireUser, type Actor } from "@/lib/auth/guards";
import { can, type Role } from "@/lib/auth/permissions";
import { db, isPostgres, models } from "@/lib/db";
import { env } from "@/lib/env";
import type { MailKind } from "@/models/mail-message";

export type MailInput = { to: string | string[]; subject: string; text: string; kind: MailKind; teamId?: number | null };

const MAX_ATTEMPTS = 6;
/** A claim older than this is taken to belong to a worker that died mid-send. */
const STALE_CLAIM_MS = 120_000;
const KICK = Symbol.for("heatpath.mail.kick");

/** An unguessable Message-ID per queue row: what the catcher receives is linked back to the row by it. */
const newMessageId = () => `<${crypto.randomBytes(16).toString("hex")}@heatpath.mail>`;

/**
 * Queue messages inside the caller's transaction: they exist exactly when the
 * action committed, and a mail failure can neither lose nor block the action.
 * One row per recipient, so one bad address does not hold up the others.
 */
export async function enqueueMail(transaction: Transaction, input: MailInput): Promise<void> {
  const recipients = [...new Set(Array.isArray(input.to) ? input.to : [input.to])];
  for (const to of recipients) {
    await models().MailMessage.create(
      {
        teamId: input.teamId ?? null,
        kind: input.kind,
        recipients: [to],
        subject: input.subject,
        body: input.text,
        nextAttemptAt: new Date(),
        claimToken: null,
        claimedAt: null,
        sentAt: null,
        lastError: null,
        messageId: newMessageId(),
      },
      { transaction },
    );
  }
  transaction.afterCommit(() => (globalThis as { [KICK]?: () => void })[KICK]?.());
}

/** Mail every member of a team holding one of `roles`, optionally leaving one user out. */
export async function enqueueMailToRoles(
  transaction: Transaction,
  teamId: number,
  roles: Role[],
  message: Omit<MailInput, "to" | "teamId">,
  options: { exceptUserId?: number; exceptUserIds?: readonly number[] } = {},
): Promise<number> {
  const { Membership, User } = models();
  const members = await Membership.findAll({ where: { teamId, role: roles }, include: [{ model: User, as: "user" }], transaction });
  const except = new Set([...(options.exceptUserIds ?? []), ...(options.exceptUserId !== undefined ? [options.exceptUserId] : [])]);
  const to = members.filter((m) => !except.has(m.userId)).map((m) => m.user!.email);
  if (to.length) await enqueueMail(transaction, { ...message, to, teamId });
  return to.length;
}

/** The worker's wake-up call; set by startMailWorker in the same process. */
export function setMailKick(kick: (() => void) | undefined): void {
  (globalThis as { [KICK]?: () => void })[KICK] = kick;
}

/**
 * Claim due rows atomically (one UPDATE), so several workers — one per app
 * server — never send the same message twice. On PostgreSQL the inner SELECT
 * locks the rows it picks and skips rows another worker holds: without that,
 * two concurrent claims could pick the same ids under READ COMMITTED.
 */
export async function claimDueMail(limit = 20): Promise<number[]> {
  const token = crypto.randomBytes(12).toString("hex");
  const now = new Date();
  const stale = new Date(now.getTime() - STALE_CLAIM_MS);
  const lock = isPostgres() ? " FOR UPDATE SKIP LOCKED" : "";
  await db().query(
    `UPDATE mail_messages SET status = 'sending', claim_token = :token, claimed_at = :now, attempts = attempts + 1, updated_at = :now
     WHERE id IN (
       SELECT id FROM mail_messages
       WHERE (status = 'queued' AND next_attempt_at <= :now) OR (status = 'sending' AND claimed_at < :stale)
       ORDER BY id LIMIT :limit${lock})`,
    { replacements: { token, now, stale, limit } },
  );
  const rows = await db().query<{ id: number }>(`SELECT id FROM mail_messages WHERE claim_token = :token ORDER BY id`, {
    replacements: { token },
    type: QueryTypes.SELECT,
  });
  return rows.map((r) => r.id);
}

/** Send what is due; failures are retried with a growing delay, then marked failed. */
export async function deliverDueMail(transport: Transporter): Promise<{ sent: number; failed: number }> {
  const { MailMessage } = models();
  const ids = await claimDueMail();
  let sent = 0;
  let failed = 0;
  for (const id of ids) {
    const message = await MailMessage.findByPk(id);
    if (!message) continue;
    try {
      await transport.sendMail({ from: env.MAIL_FROM, to: message.recipients, subject: message.subject, text: message.body, messageId: message.messageId ?? undefined });
      await message.update({ status: "sent", sentAt: new Date(), claimToken: null, lastError: null });
      sent += 1;
    } catch (error) {
      failed += 1;
      const giveUp = message.attempts >= MAX_ATTEMPTS;
      const delayMs = Math.min(300_000, 2_000 * 2 ** message.attempts);
      await message.update({
        status: giveUp ? "failed" : "queued",
        claimToken: null,
        nextAttemptAt: new Date(Date.now() + delayMs),
        lastError: (error instanceof Error ? error.message : String(error)).slice(0, 500),
      });
    }
  }
  return { sent, failed };
}

export type CaughtMailDto = { id: number; to: string[]; subject: string; text: string; receivedAt: string };
export type OutboxDto = {
  caught: CaughtMailDto[];
  queue: { queued: number; sending: number; sent: number; failed: number };
  scope: "team" | "mine";
  recentFailures: { id: number; subject: string; to: string[]; attempts: number; lastError: string | null }[];
};

/**
 * What the local catcher received, for mail this team's own actions queued:
 * each caught message is linked to its queue row (by Message-ID, on arrival)
 * and the row carries the team whose action queued it. Admins see all of
 * their team's mail; everyone else sees their team's mail addressed to them.
 * Nothing is matched by recipient address, so another team mailing the same
 * address never sees this team's messages, nor this team theirs.
 */
export async function listOutbox(actor: Actor | null, limit = 50): Promise<OutboxDto> {
  const me = requireUser(actor);
  const everything = can(me.role, "outbox.view");
  const { CaughtMail, MailMessage } = models();
  const teamMail = await MailMessage.findAll({ where: { teamId: me.teamId } });
  const shown = teamMail.filter((m) => everything || m.recipients.includes(me.email));
  const caught = shown.length
    ? (await CaughtMail.findAll({ where: { mailMessageId: shown.map((m) => m.id) }, order: [["id", "DESC"]], limit })).filter((c) => everything || c.envelopeTo.includes(me.email))
    : [];
  const queue = { queued: 0, sending: 0, sent: 0, failed: 0 };
  for (const m of shown) queue[m.status as keyof typeof queue] += 1;
  const failures = shown
    .filter((m) => m.lastError !== null)
    .sort((a, b) => b.id - a.id)
    .slice(0, 10);
  return {
    caught: caught.map((c) => ({ id: c.id, to: c.envelopeTo, subject: c.subject, text: c.text, receivedAt: c.receivedAt.toISOString() })),
    queue,
    scope: everything ? "team" : "mine",
    recentFailures: failures.map((f) => ({ id: f.id, subject: f.subject, to: f.recipients, attempts: f.attempts, lastError: f.lastError })),
  };
}
