/** Server-action matrix rows for sign-in, sign-out, invitations and team management. */
import { models } from "@/lib/db";
import { signInAction } from "@/app/(auth)/sign-in/actions";
import { acceptInvitationAction } from "@/app/(auth)/invite/[token]/actions";
import { signOutAction } from "@/app/(app)/actions";
import { changeRoleAction, inviteAction, removeMemberAction, revokeInvitationAction } from "@/app/(app)/team/actions";
import { actorOf } from "../helpers/actors";
import { everyone, type ActionExpect, type ActionRow } from "./types";

let n = 0;
async function larkspurMembership(): Promise<string> {
  const admin = await actorOf("admin");
  const user = await models().User.create({ email: `act${++n}@example.test`, name: `Act ${n}`, passwordHash: "x" });
  return String((await models().Membership.create({ teamId: admin.teamId, userId: user.id, role: "engineer" })).id);
}
async function larkspurInvitation(): Promise<string> {
  const admin = await actorOf("admin");
  const i = await models().Invitation.create({
    teamId: admin.teamId,
    invitedById: admin.userId,
    email: `actinv${++n}@example.test`,
    role: "engineer",
    tokenHash: `a${n}`.padStart(64, "0"),
    expiresAt: new Date(Date.now() + 86_400_000),
    acceptedAt: null,
    revokedAt: null,
  });
  return String(i.id);
}

const adminOnLarkspur: ActionExpect = { anonymous: 401, engineer: 403, steward: 403, reviewer: 403, admin: "ok", other: 404 };

export const ACTIONS: ActionRow[] = [
  {
    id: "app/(auth)/sign-in/actions.ts#signInAction",
    action: signInAction as ActionRow["action"],
    prepare: async () => ({ email: "erin.engineer@example.test", password: "larkspur-demo-2026" }),
    expect: everyone("ok"),
  },
  {
    id: "app/(auth)/invite/[token]/actions.ts#acceptInvitationAction",
    action: acceptInvitationAction as ActionRow["action"],
    prepare: async () => ({ token: "z".repeat(32), name: "Nobody", password: "valid-pass-123" }),
    expect: everyone(404),
  },
  { id: "app/(app)/actions.ts#signOutAction", action: signOutAction as unknown as ActionRow["action"], expect: everyone("ok") },
  {
    id: "app/(app)/team/actions.ts#changeRoleAction",
    action: changeRoleAction as ActionRow["action"],
    prepare: async () => ({ membershipId: await larkspurMembership(), role: "steward" }),
    expect: adminOnLarkspur,
  },
  {
    id: "app/(app)/team/actions.ts#removeMemberAction",
    action: removeMemberAction as ActionRow["action"],
    prepare: async () => ({ membershipId: await larkspurMembership() }),
    expect: adminOnLarkspur,
  },
  {
    id: "app/(app)/team/actions.ts#inviteAction",
    action: inviteAction as ActionRow["action"],
    prepare: async () => ({ email: `actnew${++n}@example.test`, role: "engineer" }),
    expect: { anonymous: 401, engineer: 403, steward: 403, reviewer: 403, admin: "ok", other: "ok" },
  },
  {
    id: "app/(app)/team/actions.ts#revokeInvitationAction",
    action: revokeInvitationAction as ActionRow["action"],
    prepare: async () => ({ invitationId: await larkspurInvitation() }),
    expect: adminOnLarkspur,
  },
];
