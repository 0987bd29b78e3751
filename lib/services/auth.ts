import "server-only";
import type { Actor } from "@/lib/auth/guards";
import { DUMMY_HASH, verifyPassword } from "@/lib/auth/password";
import { QueryTypes } from "sequelize";
import { db, models } from "@/lib/db";
import { AppError } from "@/lib/errors";
import type { SignInInput } from "@/lib/validation/auth";
import { releaseAttempt, signInLimits, takeAttempt } from "./rate-limit";

/** One message for an unknown account and a wrong password. */
export const INVALID_CREDENTIALS = "That e-mail and password do not match an account.";

/**
 * Check an e-mail and password. Every attempt counts against the account from this
 * address, the account overall and the address (in the database, so the limits hold
 * across app servers); a successful one is given back (lib/services/rate-limit.ts).
 */
export async function authenticate(input: SignInInput, options: { clientAddress?: string | null } = {}): Promise<{ userId: number; teamId: number }> {
  const { User, Membership } = models();
  const limits = signInLimits(input.email, options.clientAddress ?? null);
  // Counted before the password is checked, so parallel attempts cannot outrun the limit.
  await takeAttempt(limits);
  const user = await User.findOne({ where: { email: input.email } });
  const valid = await verifyPassword(input.password, user?.passwordHash ?? DUMMY_HASH);
  if (!user || !valid) throw new AppError(401, "invalid-credentials", INVALID_CREDENTIALS);
  await releaseAttempt(limits, [limits[0].key]);
  const membership = await Membership.findOne({ where: { userId: user.id }, order: [["id", "ASC"]] });
  if (!membership) throw new AppError(403, "no-team", "This account is not a member of any team yet.");
  return { userId: user.id, teamId: membership.teamId };
}

/**
 * Build the actor for a session, or null when the user or membership is gone
 * or the session was issued before the account last signed out.
 */
export async function actorFor(userId: number, teamId?: number, issuedAtMs?: number): Promise<Actor | null> {
  // One statement on every authenticated request, so it is written out rather than built by the ORM.
  const rows = await db().query<{ email: string; name: string; sessions_valid_after: string | Date | null; team_id: number; team_name: string; role: Actor["role"] }>(
    `SELECT u.email, u.name, u.sessions_valid_after, m.team_id, t.name AS team_name, m.role
       FROM users u JOIN memberships m ON m.user_id = u.id JOIN teams t ON t.id = m.team_id
      WHERE u.id = :userId ${teamId ? "AND m.team_id = :teamId" : ""}
      ORDER BY m.id LIMIT 1`,
    { replacements: { userId, teamId: teamId ?? null }, type: QueryTypes.SELECT },
  );
  const row = rows[0];
  if (!row) return null;
  const validAfter = row.sessions_valid_after ? new Date(row.sessions_valid_after).getTime() : null;
  if (issuedAtMs !== undefined && validAfter !== null && issuedAtMs < validAfter) return null;
  return { userId, email: row.email, name: row.name, teamId: Number(row.team_id), teamName: row.team_name, role: row.role };
}

export type MeDto = { user: { id: number; email: string; name: string }; team: { id: number; name: string }; role: Actor["role"] };

export function toMe(actor: Actor): MeDto {
  return {
    user: { id: actor.userId, email: actor.email, name: actor.name },
    team: { id: actor.teamId, name: actor.teamName },
    role: actor.role,
  };
}

/** Sign-out: sessions of this account issued before now are refused from here on. */
export async function endSessionsOf(userId: number): Promise<void> {
  await models().User.update({ sessionsValidAfter: new Date() }, { where: { id: userId } });
}
