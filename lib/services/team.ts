import "server-only";
import crypto from "node:crypto";
import { Op } from "sequelize";
import { requirePermission, type Actor } from "@/lib/auth/guards";
import { hashPassword } from "@/lib/auth/password";
import type { Role } from "@/lib/auth/permissions";
import { db, models } from "@/lib/db";
import { env } from "@/lib/env";
import { AppError, conflict, notFound } from "@/lib/errors";
import type { AcceptInvitationInput, InviteInput } from "@/lib/validation/team";
import { recordAudit } from "./audit";
import { enqueueMail } from "./mail";

const INVITATION_DAYS = 7;

export type MemberDto = { id: number; userId: number; name: string; email: string; role: Role; joinedAt: string };
export type InvitationDto = { id: number; email: string; role: Role; invitedBy: string | null; expiresAt: string; status: "pending" | "accepted" | "revoked" | "expired" };

const hashToken = (token: string) => crypto.createHash("sha256").update(token).digest("hex");

export async function listMembers(actor: Actor | null): Promise<MemberDto[]> {
  const me = requirePermission(actor, "team.view");
  const { Membership, User } = models();
  const rows = await Membership.findAll({
    where: { teamId: me.teamId },
    include: [{ model: User, as: "user" }],
    order: [["id", "ASC"]],
  });
  return rows.map((m) => ({
    id: m.id,
    userId: m.userId,
    name: m.user!.name,
    email: m.user!.email,
    role: m.role,
    joinedAt: m.createdAt.toISOString(),
  }));
}

async function adminCount(teamId: number, transaction: import("sequelize").Transaction) {
  return models().Membership.count({ where: { teamId, role: "admin" }, transaction });
}

export async function changeRole(actor: Actor | null, membershipId: number, role: Role): Promise<MemberDto> {
  const me = requirePermission(actor, "members.manage");
  const { Membership } = models();
  await db().transaction(async (transaction) => {
    const membership = await Membership.findByPk(membershipId, { transaction });
    if (!membership || membership.teamId !== me.teamId) throw notFound("Member");
    if (membership.role === role) return;
    if (membership.role === "admin" && (await adminCount(me.teamId, transaction)) <= 1) {
      throw conflict("A team needs at least one admin: make someone else admin first.");
    }
    const before = { role: membership.role };
    membership.role = role;
    await membership.save({ transaction });
    await recordAudit(transaction, {
      action: "membership.role-changed",
      entityType: "membership",
      entityId: membership.id,
      teamId: me.teamId,
      actorId: me.userId,
      before,
      after: { role },
    });
  });
  const members = await listMembers(me);
  return members.find((m) => m.id === membershipId)!;
}

export async function removeMember(actor: Actor | null, membershipId: number): Promise<void> {
  const me = requirePermission(actor, "members.manage");
  const { Membership } = models();
  await db().transaction(async (transaction) => {
    const membership = await Membership.findByPk(membershipId, { transaction });
    if (!membership || membership.teamId !== me.teamId) throw notFound("Member");
    if (membership.role === "admin" && (await adminCount(me.teamId, transaction)) <= 1) {
      throw conflict("A team needs at least one admin: make someone else admin first.");
    }
    await membership.destroy({ transaction });
    await recordAudit(transaction, {
      action: "membership.removed",
      entityType: "membership",
      entityId: membership.id,
      teamId: me.teamId,
      actorId: me.userId,
      before: { userId: membership.userId, role: membership.role },
    });
  });
}

function invitationStatus(i: { acceptedAt: Date | null; revokedAt: Date | null; expiresAt: Date }): InvitationDto["status"] {
  if (i.acceptedAt) return "accepted";
  if (i.revokedAt) return "revoked";
  if (i.expiresAt.getTime() < Date.now()) return "expired";
  return "pending";
}

export async function listInvitations(actor: Actor | null): Promise<InvitationDto[]> {
  const me = requirePermission(actor, "invitations.manage");
  const { Invitation, User } = models();
  const rows = await Invitation.findAll({
    where: { teamId: me.teamId },
    include: [{ model: User, as: "invitedBy" }],
    order: [["id", "DESC"]],
  });
  return rows.map((i) => ({
    id: i.id,
    email: i.email,
    role: i.role,
    invitedBy: (i as unknown as { invitedBy?: { name: string } }).invitedBy?.name ?? null,
    expiresAt: i.expiresAt.toISOString(),
    status: invitationStatus(i),
  }));
}

/** The link itself is only ever in the mail to the invitee. */
export type CreatedInvitation = { invitation: InvitationDto; mailedTo: string };

function invitationText(teamName: string, inviter: string, role: Role, link: string): string {
  return [
    `${inviter} has invited you to join ${teamName} on Heatpath as ${role}.`,
    "",
    "Open this link to choose your password and join the team (it works once and expires in 7 days):",
    link,
    "",
    "If you did not expect this message, you can ignore it.",
  ].join("\n");
}

export async function invite(actor: Actor | null, input: InviteInput): Promise<CreatedInvitation> {
  const me = requirePermission(actor, "invitations.manage");
  const { Invitation, Membership, User } = models();
  const token = crypto.randomBytes(24).toString("base64url");
  const created = await db().transaction(async (transaction) => {
    const existingUser = await User.findOne({ where: { email: input.email }, transaction });
    if (existingUser && (await Membership.findOne({ where: { userId: existingUser.id, teamId: me.teamId }, transaction }))) {
      throw conflict(`${input.email} is already a member of this team.`);
    }
    const pending = await Invitation.findOne({
      where: { teamId: me.teamId, email: input.email, acceptedAt: null, revokedAt: null, expiresAt: { [Op.gt]: new Date() } },
      transaction,
    });
    if (pending) throw conflict(`${input.email} already has a pending invitation; revoke it to send a new one.`);
    const invitation = await Invitation.create(
      {
        teamId: me.teamId,
        invitedById: me.userId,
        email: input.email,
        role: input.role,
        tokenHash: hashToken(token),
        expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000),
        acceptedAt: null,
        revokedAt: null,
      },
      { transaction },
    );
    await recordAudit(transaction, {
      action: "invitation.created",
      entityType: "invitation",
      entityId: invitation.id,
      teamId: me.teamId,
      actorId: me.userId,
      after: { email: input.email, role: input.role },
    });
    const link = `${env.APP_URL.replace(/\/$/, "")}/invite/${token}`;
    await enqueueMail(transaction, {
      kind: "invitation",
      teamId: me.teamId,
      to: input.email,
      subject: `Join ${me.teamName} on Heatpath`,
      text: invitationText(me.teamName, me.name, input.role, link),
    });
    return invitation;
  });
  return {
    invitation: {
      id: created.id,
      email: created.email,
      role: created.role,
      invitedBy: me.name,
      expiresAt: created.expiresAt.toISOString(),
      status: "pending",
    },
    mailedTo: created.email,
  };
}

export async function revokeInvitation(actor: Actor | null, invitationId: number): Promise<void> {
  const me = requirePermission(actor, "invitations.manage");
  const { Invitation } = models();
  await db().transaction(async (transaction) => {
    const invitation = await Invitation.findByPk(invitationId, { transaction });
    if (!invitation || invitation.teamId !== me.teamId) throw notFound("Invitation");
    if (invitationStatus(invitation) !== "pending") throw conflict("Only a pending invitation can be revoked.");
    invitation.revokedAt = new Date();
    await invitation.save({ transaction });
    await recordAudit(transaction, {
      action: "invitation.revoked",
      entityType: "invitation",
      entityId: invitation.id,
      teamId: me.teamId,
      actorId: me.userId,
      before: { status: "pending" },
      after: { status: "revoked" },
    });
  });
}

const INVALID_INVITATION = "This invitation link is not valid: it may have been used, revoked or have expired.";

export type InvitationPreview = { email: string; teamName: string; role: Role; existingAccount: boolean };

/** Public: what an invitation link offers, without signing in. */
export async function previewInvitation(token: string): Promise<InvitationPreview> {
  const { Invitation, Team, User } = models();
  const invitation = await Invitation.findOne({ where: { tokenHash: hashToken(token) }, include: [{ model: Team, as: "team" }] });
  if (!invitation || invitationStatus(invitation) !== "pending") throw new AppError(404, "invalid-invitation", INVALID_INVITATION);
  const existing = await User.findOne({ where: { email: invitation.email } });
  return { email: invitation.email, teamName: invitation.team!.name, role: invitation.role, existingAccount: !!existing };
}

/** Public: accept an invitation, creating the account if needed. Single use. */
export async function acceptInvitation(input: AcceptInvitationInput): Promise<{ userId: number; teamId: number }> {
  const { Invitation, Membership, User } = models();
  const passwordHash = await hashPassword(input.password);
  return db().transaction(async (transaction) => {
    const invitation = await Invitation.findOne({ where: { tokenHash: hashToken(input.token) }, transaction });
    if (!invitation || invitationStatus(invitation) !== "pending") throw new AppError(404, "invalid-invitation", INVALID_INVITATION);
    let user = await User.findOne({ where: { email: invitation.email }, transaction });
    if (user) {
      throw new AppError(409, "account-exists", "An account with this e-mail already exists: sign in, then ask the admin to add you.");
    }
    user = await User.create({ email: invitation.email, name: input.name, passwordHash }, { transaction });
    const membership = await Membership.create({ teamId: invitation.teamId, userId: user.id, role: invitation.role }, { transaction });
    invitation.acceptedAt = new Date();
    await invitation.save({ transaction });
    await recordAudit(transaction, {
      action: "membership.joined",
      entityType: "membership",
      entityId: membership.id,
      teamId: invitation.teamId,
      actorId: user.id,
      after: { userId: user.id, role: invitation.role, invitationId: invitation.id },
    });
    return { userId: user.id, teamId: invitation.teamId };
  });
}
