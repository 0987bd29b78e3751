/**
 * The Outbox across teams, tried as the other team's admin would: Tom (Tansy admin) invites an
 * address Larkspur already invited, and a Larkspur member's address, then reads his Outbox hoping
 * for Larkspur's invitation link and review mail. Addresses and names are the invented demo teams.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, db, models } from "@/lib/db";
import { createMailTransport } from "@/lib/mail";
import { deliverDueMail, enqueueMail, listOutbox } from "@/lib/services/mail";
import { acceptInvitation, invite } from "@/lib/services/team";
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

const tokenIn = (text: string) => text.match(/\/invite\/([A-Za-z0-9_-]+)/)?.[1];

describe("the Outbox keeps each team's mail to that team", () => {
  it("Tansy's admin who invites Larkspur's addresses reads none of Larkspur's mail", async () => {
    const alex = await actorOf("admin");
    const tom = await actorOf("other");
    const erin = await actorOf("engineer");
    // Larkspur's own mail: an invitation (with its link) and a review decision for Erin.
    await invite(alex, { email: "nell.newcomer@example.test", role: "steward" });
    await db().transaction((t) =>
      enqueueMail(t, { kind: "review-decided", teamId: alex.teamId, to: erin.email, subject: "Case returned: Larkspur reformer", text: "Reason: check the steam ratio." }),
    );
    await deliverDueMail(createMailTransport());

    // Tom invites the same two addresses (allowed: a pending invitation or membership elsewhere is no bar).
    await invite(tom, { email: "nell.newcomer@example.test", role: "engineer" });
    await invite(tom, { email: erin.email, role: "engineer" });
    await deliverDueMail(createMailTransport());

    const tomsOutbox = await listOutbox(tom);
    const subjects = tomsOutbox.caught.map((c) => c.subject);
    expect(subjects.sort()).toEqual(["Join Tansy Gas Cooperative on Heatpath", "Join Tansy Gas Cooperative on Heatpath"]);
    expect(tomsOutbox.caught.map((c) => c.text).join("\n")).not.toMatch(/Larkspur|steam ratio/);
    // The only invitation links Tom can read are Tansy's own.
    for (const c of tomsOutbox.caught) {
      const invitation = await models().Invitation.findOne({ where: { email: c.to[0], teamId: tom.teamId } });
      expect(invitation).not.toBeNull();
      expect(tokenIn(c.text)).toBeTruthy();
    }

    // Larkspur's admin still sees all of Larkspur's mail and none of Tansy's.
    const alexOutbox = await listOutbox(alex);
    expect(alexOutbox.caught.map((c) => c.subject).sort()).toEqual(["Case returned: Larkspur reformer", "Join Larkspur Hydrogen Works on Heatpath"]);
    expect(alexOutbox.queue.sent).toBe(2);
  });

  it("a member sees only mail their own team queued for them, not another team's invitation to the same address", async () => {
    const erin = await actorOf("engineer");
    const mine = await listOutbox(erin);
    expect(mine.scope).toBe("mine");
    expect(mine.caught.map((c) => c.subject)).toEqual(["Case returned: Larkspur reformer"]);
    const tara = await actorOf("other");
    expect(tara.teamId).not.toBe(erin.teamId);
  });

  it("mail that reached the catcher without a queue row of the team is shown to nobody", async () => {
    // Synthetic, invented for this test: a message sent straight to the catcher, addressed to a Larkspur member.
    const erin = await actorOf("engineer");
    await createMailTransport().sendMail({ from: "someone@example.test", to: erin.email, subject: "Stray message", text: "not queued by Heatpath" });
    expect((await listOutbox(await actorOf("admin"))).caught.map((c) => c.subject)).not.toContain("Stray message");
    expect((await listOutbox(erin)).caught.map((c) => c.subject)).not.toContain("Stray message");
  });

  it("an invitation token grants membership only in the team that issued it", async () => {
    const tom = await actorOf("other");
    const alex = await actorOf("admin");
    await invite(alex, { email: "otto.overlap@example.test", role: "steward" });
    await invite(tom, { email: "otto.overlap@example.test", role: "engineer" });
    await deliverDueMail(createMailTransport());
    const tansyMail = (await listOutbox(tom)).caught.find((c) => c.to.includes("otto.overlap@example.test"))!;
    const token = tokenIn(tansyMail.text)!;
    const joined = await acceptInvitation({ token, name: "Otto Overlap", password: "a long enough password 1" });
    expect(joined.teamId).toBe(tom.teamId);
    const memberships = await models().Membership.findAll({ where: { userId: joined.userId } });
    expect(memberships.map((m) => [m.teamId, m.role])).toEqual([[tom.teamId, "engineer"]]);
    // Larkspur's invitation is still Larkspur's, still pending, and was never readable by Tom.
    const larkspur = await models().Invitation.findOne({ where: { email: "otto.overlap@example.test", teamId: alex.teamId } });
    expect(larkspur!.acceptedAt).toBeNull();
  });
});
