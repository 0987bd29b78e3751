import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, models } from "@/lib/db";
import { authenticate, INVALID_CREDENTIALS } from "@/lib/services/auth";
import { acceptInvitation, changeRole, invite, listInvitations, listMembers, previewInvitation, removeMember, revokeInvitation } from "@/lib/services/team";
import { DEMO_PASSWORD } from "@/seeders/demo-accounts";
import { actorOf } from "../helpers/actors";
import { freshDatabase, tableCounts } from "../helpers/db";

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

/** The invitation token travels only in the queued mail. */
async function tokenFor(email: string): Promise<string> {
  const mail = await models().MailMessage.findOne({ where: { kind: "invitation" }, order: [["id", "DESC"]] });
  expect(mail!.recipients).toEqual([email]);
  return mail!.body.match(/\/invite\/([A-Za-z0-9_-]+)/)![1];
}

describe("sign-in", () => {
  it("accepts a demo account and finds its team", async () => {
    const session = await authenticate({ email: "erin.engineer@example.test", password: DEMO_PASSWORD });
    expect(session.teamId).toBeGreaterThan(0);
  });

  it("gives the same message for an unknown account and a wrong password", async () => {
    await expect(authenticate({ email: "nobody@example.test", password: DEMO_PASSWORD })).rejects.toMatchObject({ status: 401, message: INVALID_CREDENTIALS });
    await expect(authenticate({ email: "erin.engineer@example.test", password: "not-the-password" })).rejects.toMatchObject({ status: 401, message: INVALID_CREDENTIALS });
  });

  it("stores bcrypt hashes of cost 10 or more", async () => {
    const user = await models().User.findOne({ where: { email: "erin.engineer@example.test" } });
    const cost = Number(user!.passwordHash.split("$")[2]);
    // Common practice: bcrypt cost 10 is the usual minimum.
    expect(cost).toBeGreaterThanOrEqual(10);
  });
});

describe("invitations", () => {
  it("lets an admin invite and the invitee accept once, with audit events", async () => {
    const admin = await actorOf("admin");
    const created = await invite(admin, { email: "nia.new@example.test", role: "reviewer" });
    const token = await tokenFor("nia.new@example.test");
    const stored = await models().Invitation.findByPk(created.invitation.id);
    expect(stored!.tokenHash).not.toContain(token);
    expect(stored!.tokenHash).toMatch(/^[0-9a-f]{64}$/);

    expect(await previewInvitation(token)).toMatchObject({ email: "nia.new@example.test", role: "reviewer", teamName: "Larkspur Hydrogen Works" });
    const joined = await acceptInvitation({ token, name: "Nia New", password: "kettle-7-boils" });
    expect(joined.teamId).toBe(admin.teamId);
    expect((await listMembers(admin)).some((m) => m.email === "nia.new@example.test" && m.role === "reviewer")).toBe(true);

    await expect(acceptInvitation({ token, name: "Again", password: "kettle-7-boils" })).rejects.toMatchObject({ status: 404, code: "invalid-invitation" });
    const actions = (await models().AuditEvent.findAll({ where: { teamId: admin.teamId } })).map((e) => e.action);
    expect(actions).toEqual(expect.arrayContaining(["invitation.created", "membership.joined"]));
  });

  it("refuses a second pending invitation and an existing member", async () => {
    const admin = await actorOf("admin");
    await invite(admin, { email: "omar.once@example.test", role: "engineer" });
    await expect(invite(admin, { email: "omar.once@example.test", role: "engineer" })).rejects.toMatchObject({ status: 409 });
    await expect(invite(admin, { email: "erin.engineer@example.test", role: "engineer" })).rejects.toMatchObject({
      status: 409,
      message: "erin.engineer@example.test is already a member of this team.",
    });
  });

  it("makes a revoked invitation unusable", async () => {
    const admin = await actorOf("admin");
    const created = await invite(admin, { email: "rev.oked@example.test", role: "engineer" });
    await revokeInvitation(admin, created.invitation.id);
    expect((await listInvitations(admin)).find((i) => i.id === created.invitation.id)!.status).toBe("revoked");
    await expect(previewInvitation(await tokenFor("rev.oked@example.test"))).rejects.toMatchObject({ status: 404 });
  });

  it("refuses a weak password without writing anything", async () => {
    const { acceptInvitationSchema } = await import("@/lib/validation/team");
    const parsed = acceptInvitationSchema.safeParse({ token: "x".repeat(32), name: "A", password: "short" });
    expect(parsed.success).toBe(false);
    expect(parsed.error!.issues[0].message).toBe("Use at least 10 characters.");
  });
});

describe("roles", () => {
  it("lets an admin change a role and writes before/after", async () => {
    const admin = await actorOf("admin");
    const member = (await listMembers(admin)).find((m) => m.email === "rory.reviewer@example.test")!;
    const changed = await changeRole(admin, member.id, "engineer");
    expect(changed.role).toBe("engineer");
    const event = await models().AuditEvent.findOne({ where: { action: "membership.role-changed", entityId: String(member.id) } });
    expect(event!.before).toEqual({ role: "reviewer" });
    expect(event!.after).toEqual({ role: "engineer" });
    await changeRole(admin, member.id, "reviewer");
  });

  it("keeps at least one admin", async () => {
    const admin = await actorOf("admin");
    const me = (await listMembers(admin)).find((m) => m.userId === admin.userId)!;
    const before = await tableCounts();
    await expect(changeRole(admin, me.id, "engineer")).rejects.toMatchObject({ status: 409 });
    await expect(removeMember(admin, me.id)).rejects.toMatchObject({ status: 409 });
    expect(await tableCounts()).toEqual(before);
  });

  it("refuses non-admins (403) and another team's member (404)", async () => {
    const steward = await actorOf("steward");
    const other = await actorOf("other");
    const target = (await listMembers(steward)).find((m) => m.email === "erin.engineer@example.test")!;
    await expect(changeRole(steward, target.id, "admin")).rejects.toMatchObject({ status: 403 });
    await expect(changeRole(other, target.id, "admin")).rejects.toMatchObject({ status: 404 });
    await expect(removeMember(other, target.id)).rejects.toMatchObject({ status: 404 });
  });

  it("removes a member with an audit event", async () => {
    const admin = await actorOf("admin");
    const target = (await listMembers(admin)).find((m) => m.email === "nia.new@example.test")!;
    await removeMember(admin, target.id);
    expect((await listMembers(admin)).some((m) => m.id === target.id)).toBe(false);
    expect(await models().AuditEvent.count({ where: { action: "membership.removed", entityId: String(target.id) } })).toBe(1);
  });
});

describe("invitation expiry", () => {
  it("refuses a link past its expiry, and lists it as expired", async () => {
    const admin = await actorOf("admin");
    const created = await invite(admin, { email: "late.larry@example.test", role: "engineer" });
    const token = await tokenFor("late.larry@example.test");
    await models().Invitation.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { id: created.invitation.id } });
    await expect(previewInvitation(token)).rejects.toMatchObject({ status: 404, code: "invalid-invitation" });
    await expect(acceptInvitation({ token, name: "Larry", password: "kettle-7-boils" })).rejects.toMatchObject({ status: 404 });
    expect((await listInvitations(admin)).find((i) => i.id === created.invitation.id)!.status).toBe("expired");
  });
});
