import { AppError, forbidden, notFound, unauthenticated } from "@/lib/errors";
import { can, type Action, type Role } from "./permissions";

/** Who is asking: the signed-in user in their active team. */
export type Actor = {
  userId: number;
  email: string;
  name: string;
  teamId: number;
  teamName: string;
  role: Role;
};

const ACTION_WORDS: Partial<Record<Action, string>> = {
  "members.manage": "manage members",
  "invitations.manage": "manage invitations",
  "outbox.view": "read the outbox",
  "models.edit": "edit models",
  "models.decide": "approve or reject models",
  "cases.review": "review cases",
};

/** 401 when nobody is signed in. */
export function requireUser(actor: Actor | null | undefined): Actor {
  if (!actor) throw unauthenticated();
  return actor;
}

/** 401 without a session, 403 when the role's permission row leaves it out. */
export function requirePermission(actor: Actor | null | undefined, action: Action): Actor {
  const user = requireUser(actor);
  if (!can(user.role, action)) throw forbidden(ACTION_WORDS[action] ?? action.replace(".", " "));
  return user;
}

/** Another team's record is answered as if it did not exist (404). */
export function requireSameTeam(actor: Actor, teamId: number | null | undefined, what = "Record"): void {
  if (teamId !== actor.teamId) throw notFound(what);
}

/** Four-eyes rule: nobody decides on their own work. */
export function requireNotAuthor(actor: Actor, authorId: number | null | undefined, message: string): void {
  if (authorId === actor.userId) throw new AppError(403, "own-work", message);
}
