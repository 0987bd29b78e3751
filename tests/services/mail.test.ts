import { afterAll, beforeAll, describe, expect, it } from "vitest";
import nodemailer from "nodemailer";
import { closeDb, db, models } from "@/lib/db";
import { createMailTransport } from "@/lib/mail";
import { claimDueMail, deliverDueMail, enqueueMail, listOutbox } from "@/lib/services/mail";
import { invite, previewInvitation } from "@/lib/services/team";
import { actorOf } from "../helpers/actors";
import { freshDatabase } from "../helpers/db";
import { startTestMailCatcher } from "../helpers/mail";

let stopCatcher: () => Promise<void>;

beforeAll(async () => {
  await freshDatabase();
  stopCatcher = await startTestMailCatcher();
});
afterAll(async () => {
  await stopCatcher();
  await closeDb();
});

describe("mail end to end", () => {
  it("queues the invitation with the action, delivers it to the catcher, and the link works", async () => {
    const admin = await actorOf("admin");
    await invite(admin, { email: "ivy.invitee@example.test", role: "engineer" });
    const queued = await models().MailMessage.findOne({ where: { kind: "invitation" } });
    expect(queued).toMatchObject({ status: "queued", recipients: ["ivy.invitee@example.test"] });

    const result = await deliverDueMail(createMailTransport());
    expect(result).toEqual({ sent: 1, failed: 0 });
    const caught = await models().CaughtMail.findOne({ order: [["id", "DESC"]] });
    expect(caught!.envelopeTo).toEqual(["ivy.invitee@example.test"]);
    expect(caught!.subject).toBe("Join Larkspur Hydrogen Works on Heatpath");
    const token = caught!.text.match(/\/invite\/([A-Za-z0-9_-]+)/)![1];
    await expect(previewInvitation(token)).resolves.toMatchObject({ email: "ivy.invitee@example.test" });
    expect((await models().MailMessage.findByPk(queued!.id))!.status).toBe("sent");

    const outbox = await listOutbox(admin);
    expect(outbox.caught[0]).toMatchObject({ subject: "Join Larkspur Hydrogen Works on Heatpath", to: ["ivy.invitee@example.test"] });
    expect(outbox.queue.sent).toBeGreaterThanOrEqual(1);
    // Another team's admin does not see Larkspur's mail.
    expect((await listOutbox(await actorOf("other"))).caught).toEqual([]);
  });

  it("keeps the action and retries later when the mail server is down", async () => {
    const admin = await actorOf("admin");
    await invite(admin, { email: "dan.down@example.test", role: "engineer" });
    const dead = nodemailer.createTransport({ host: "127.0.0.1", port: 9, secure: false, ignoreTLS: true, connectionTimeout: 500 });
    const result = await deliverDueMail(dead);
    expect(result.failed).toBe(1);
    const row = await models().MailMessage.findOne({ where: { kind: "invitation" }, order: [["id", "DESC"]] });
    expect(row!.recipients).toEqual(["dan.down@example.test"]);
    expect(row).toMatchObject({ status: "queued", attempts: 1 });
    expect(row!.lastError).toBeTruthy();
    expect(row!.nextAttemptAt.getTime()).toBeGreaterThan(Date.now());
    expect(await models().Invitation.count({ where: { email: "dan.down@example.test" } })).toBe(1);
    // Not due yet: nothing is claimed.
    expect(await claimDueMail()).toEqual([]);
  });

  it("claims each due row once across concurrent workers", async () => {
    await db().transaction(async (transaction) => {
      for (let i = 0; i < 10; i++) await enqueueMail(transaction, { kind: "model-decided", to: `w${i}@example.test`, subject: `s${i}`, text: "t" });
    });
    const [a, b, c] = await Promise.all([claimDueMail(4), claimDueMail(4), claimDueMail(4)]);
    const all = [...a, ...b, ...c];
    expect(new Set(all).size).toBe(all.length);
    expect(all.length).toBe(10);
  });

  it("shows a non-admin only the mail addressed to them", async () => {
    const erin = await actorOf("engineer");
    const admin = await actorOf("admin");
    await db().transaction((t) => enqueueMail(t, { kind: "review-decided", teamId: erin.teamId, to: erin.email, subject: "For Erin", text: "t" }));
    await deliverDueMail(createMailTransport());
    const mine = await listOutbox(erin);
    expect(mine.scope).toBe("mine");
    expect(mine.caught.map((c) => c.subject)).toEqual(["For Erin"]);
    expect((await listOutbox(admin)).caught.map((c) => c.subject)).toContain("Join Larkspur Hydrogen Works on Heatpath");
    await expect(listOutbox(null)).rejects.toMatchObject({ status: 401 });
  });
});
