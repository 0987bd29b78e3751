import "server-only";
import type { Actor } from "@/lib/auth/guards";
import { DUMMY_HASH, verifyPassword } from "@/lib/auth/password";
import { models } from "@/lib/db";
import { AppError } from "@/lib/errors";
import type { SignInInput } from "@/lib/validation/auth";
import { assertUnderLimits, clearLimits, countFailure, signInLimits } from "./rate-limit";

/** One message for an unknown account and a wrong password. */
export const INVALID_CREDENTIALS = "That e-mail and password do not match an account.";

/**
 * Check an e-mail and password. Failures count against the account and the
 * client address (in the database, so the limit holds across app servers).
 */
export async function authenticate(input: SignInInput, options: { clientAddress?: string | null } = {}): Promise<{ userId: number; teamId: number }> {
  const { User, Membership } = models();
  const limits = signInLimits(input.email, options.clientAddress ?? null);
  await assertUnderLimits(limits);
  const user = await User.findOne({ where: { email: input.email } });
  const valid = await verifyPassword(input.password, user?.passwordHash ?? DUMMY_HASH);
  if (!user || !valid) {
    await countFailure(limits);
    throw new AppError(401, "invalid-credentials", INVALID_CREDENTIALS);
  }
  await clearLimits([limits[0].key]);
  const membership = await Membership.findOne({ where: { userId: user.id }, order: [["id", "ASC"]] });
  if (!membership) throw new AppError(403, "no-team", "This account is not a member of any team yet.");
  return { userId: user.id, teamId: membership.teamId };
}

/**
 * Build the actor for a session, or null when the user or membership is gone
 * or the session was issued before the account last signed out.
 */
export async function actorFor(userId: number, teamId?: number, issuedAtMs?: number): Promise<Actor | null> {
  const { User, Membership, Team } = models();
  const user = await User.findByPk(userId);
  if (!user) return null;
  if (issuedAtMs !== undefined && user.sessionsValidAfter && issuedAtMs < user.sessionsValidAfter.getTime()) return null;
  const membership = await Membership.findOne({
    where: teamId ? { userId, teamId } : { userId },
    include: [{ model: Team, as: "team" }],
    order: [["id", "ASC"]],
  });
  if (!membership || !membership.team) return null;
  return {
    userId: user.id,
    email: user.email,
    name: user.name,
    teamId: membership.teamId,
    teamName: membership.team.name,
    role: membership.role,
  };
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
