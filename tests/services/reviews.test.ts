import { CAUTION_TEXT } from "@/lib/cases/caution";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, models } from "@/lib/db";
import { verifySnapshot } from "@/lib/cases/snapshot";
import { createCase, diffSnapshots, getResults, getSnapshot, submitCase, updateCase } from "@/lib/services/cases";
import { decideCase, homeCounts, reviewQueue } from "@/lib/services/reviews";
import { caseInputSchema, decisionSchema } from "@/lib/validation/cases";
import { actorOf } from "../helpers/actors";
import { shiftCase } from "../helpers/cases";
import { freshDatabase, tableCounts } from "../helpers/db";
import { ensureReferenceLibrary, type RefFormula } from "../helpers/reference-library";

let pins: Record<RefFormula, number>;

beforeAll(async () => {
  await freshDatabase();
  pins = await ensureReferenceLibrary();
});
afterAll(() => closeDb());

async function submitted(who: "engineer" | "admin" = "engineer", title = "Shift for review") {
  const author = await actorOf(who);
  const c = await createCase(author, caseInputSchema.parse(shiftCase(pins, { title })));
  return submitCase(author, c.id, c.lockVersion);
}

describe("review rules", () => {
  it("nobody reviews their own case (four-eyes), even an admin", async () => {
    const c = await submitted("admin", "Admin's own case");
    const admin = await actorOf("admin");
    const before = await tableCounts();
    await expect(decideCase(admin, c.id, decisionSchema.parse({ decision: "approved" }))).rejects.toMatchObject({
      status: 403,
      code: "own-work",
      message: "Nobody reviews their own case: another reviewer must decide it.",
    });
    expect(await tableCounts()).toEqual(before);
    expect((await reviewQueue(admin)).map((x) => x.id)).not.toContain(c.id);
    expect((await reviewQueue(await actorOf("reviewer"))).map((x) => x.id)).toContain(c.id);
  });

  it("a role without cases.review gets 403, another team 404", async () => {
    const c = await submitted();
    for (const who of ["engineer", "steward"] as const) {
      await expect(decideCase(await actorOf(who), c.id, decisionSchema.parse({ decision: "approved" }))).rejects.toMatchObject({ status: 403, code: "forbidden" });
    }
    await expect(decideCase(await actorOf("other"), c.id, decisionSchema.parse({ decision: "approved" }))).rejects.toMatchObject({ status: 404 });
    await expect(reviewQueue(await actorOf("engineer"))).rejects.toMatchObject({ status: 403 });
  });

  it("a return needs a reason", () => {
    const parsed = decisionSchema.safeParse({ decision: "returned", reason: "  " });
    expect(parsed.success).toBe(false);
    expect(parsed.error!.issues[0]).toMatchObject({ path: ["reason"], message: "Say what needs to change (at least 5 characters)." });
  });

  it("a decision on an older revision is refused as stale", async () => {
    const c = await submitted();
    await expect(decideCase(await actorOf("reviewer"), c.id, decisionSchema.parse({ decision: "approved", revision: 7 }))).rejects.toMatchObject({ status: 409 });
  });
});

describe("return, revise, resubmit, approve", () => {
  it("keeps the old snapshot readable and unchanged, mails the author each decision, and diffs the revisions", async () => {
    const erin = await actorOf("engineer");
    const rory = await actorOf("reviewer");
    const c = await submitted();
    const first = await getSnapshot(erin, c.id, 1);

    const returned = await decideCase(rory, c.id, decisionSchema.parse({ decision: "returned", reason: "Extend the span to 800 K to cover start-up." }));
    expect(returned.status).toBe("returned");
    expect(returned.snapshots[0].decision).toMatchObject({ decision: "returned", reason: "Extend the span to 800 K to cover start-up.", reviewerName: "Rory Achebe" });
    const told = await models().MailMessage.findAll({ where: { kind: "review-decided" } });
    expect(told.flatMap((m) => m.recipients)).toEqual(["erin.engineer@example.test"]);
    expect(told[0].body).toContain("Extend the span to 800 K");
    expect(told[0].body).toContain(CAUTION_TEXT);

    // A returned case is edited and evaluated live again.
    const edited = await updateCase(erin, c.id, {
      ...caseInputSchema.parse(shiftCase(pins, { title: "Shift for review", temperatures: { fromK: 480, toK: 800, stepK: 20 } })),
      lockVersion: returned.lockVersion,
    });
    expect((await getResults(erin, c.id)).source).toBe("live");
    const again = await submitCase(erin, c.id, edited.lockVersion);
    expect(again.snapshots.map((s) => s.revision)).toEqual([1, 2]);

    const old = await getSnapshot(erin, c.id, 1);
    expect(old.hash).toBe(first.hash);
    expect(old.result).toEqual(first.result);
    expect(verifySnapshot((await models().CaseSnapshot.findOne({ where: { caseId: c.id, revision: 1 } }))!)).toBe(true);
    expect((await getResults(erin, c.id)).revision).toBe(2);

    const diff = await diffSnapshots(rory, c.id, 1, 2);
    expect(diff.inputs).toEqual([{ path: "temperatures.toK", from: 700, to: 800 }]);
    expect(diff.points.common).toBe(12);
    expect(diff.points.maxAbsDGkJ).toBe(0);

    const approved = await decideCase(rory, c.id, decisionSchema.parse({ decision: "approved", revision: 2 }));
    expect(approved.status).toBe("approved");
    await expect(decideCase(rory, c.id, decisionSchema.parse({ decision: "approved" }))).rejects.toMatchObject({ status: 409 });
    await expect(updateCase(erin, c.id, { ...caseInputSchema.parse(shiftCase(pins)), lockVersion: approved.lockVersion })).rejects.toMatchObject({ status: 409 });
    const actions = (await models().AuditEvent.findAll({ where: { entityType: "case", entityId: String(c.id) }, order: [["id", "ASC"]] })).map((a) => a.action);
    expect(actions).toEqual(["case.created", "case.submitted", "case.returned", "case.updated", "case.resubmitted", "case.approved"]);
  });
});

describe("home counts", () => {
  it("show my drafts to an engineer and the queue to a reviewer", async () => {
    const erin = await actorOf("engineer");
    await createCase(erin, caseInputSchema.parse(shiftCase(pins, { title: "Home draft" })));
    const mine = await homeCounts(erin);
    expect(mine.drafts.map((d) => d.title)).toContain("Home draft");
    expect(mine.reviews).toEqual([]);
    const theirs = await homeCounts(await actorOf("reviewer"));
    expect(theirs.drafts).toEqual([]);
    expect(theirs.reviews.length).toBeGreaterThan(0);
    expect(theirs.decisions.count30d).toBeGreaterThan(0);
  });
});
