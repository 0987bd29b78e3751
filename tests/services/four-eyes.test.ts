/**
 * The four-eyes rule on model versions, attacked by stewards who change or propose someone
 * else's draft and then decide on it: nobody who changed a version's content or proposed it
 * may approve or reject it. Cp numbers are synthetic, invented for this test.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, models } from "@/lib/db";
import * as lib from "@/lib/services/library";
import { homeCounts } from "@/lib/services/reviews";
import { createCase, updateCase } from "@/lib/services/cases";
import { actorOf } from "../helpers/actors";
import { freshDatabase } from "../helpers/db";
import { shiftCase } from "../helpers/cases";
import { createDraft, solidData as solid } from "../helpers/library";
import { ensureReferenceLibrary } from "../helpers/reference-library";
import { refusal } from "../helpers/refusal";
import { caseInputSchema } from "@/lib/validation/cases";

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

let n = 0;
async function erinsDraft() {
  return (await createDraft("engineer", `Four-eyes ${++n}`)).version;
}

describe("nobody who changed or proposed a version decides on it", () => {
  it("a steward who edits an engineer's draft, proposes it and approves it is refused; a second steward decides", async () => {
    const sam = await actorOf("steward");
    const stella = await actorOf("steward2");
    const v = await erinsDraft();
    await lib.editVersion(sam, v.id, { lockVersion: 0, data: solid(999) });
    await lib.proposeVersion(sam, v.id);
    const approve = await refusal(lib.approveVersion(sam, v.id));
    expect([approve.status, approve.code, approve.message]).toEqual([403, "own-work", "You changed or proposed this version: another steward must approve or reject it."]);
    expect((await refusal(lib.rejectVersion(sam, v.id, "no"))).code).toBe("own-work");
    expect((await lib.getVersion(sam, v.id)).status).toBe("proposed");
    await expect(lib.approveVersion(stella, v.id)).resolves.toMatchObject({ status: "approved", decidedByName: "Stella Marsh" });
  });

  it("an editor is refused even when the author proposes", async () => {
    const sam = await actorOf("steward");
    const erin = await actorOf("engineer");
    const v = await erinsDraft();
    await lib.editVersion(sam, v.id, { lockVersion: 0, citation: "Changed by Sam" });
    await lib.proposeVersion(erin, v.id);
    expect((await refusal(lib.approveVersion(sam, v.id))).code).toBe("own-work");
    expect((await refusal(lib.rejectVersion(sam, v.id, "no"))).code).toBe("own-work");
  });

  it("a steward who only proposed someone else's draft cannot decide on it", async () => {
    const stella = await actorOf("steward2");
    const v = await erinsDraft();
    await lib.proposeVersion(stella, v.id);
    expect((await refusal(lib.approveVersion(stella, v.id))).code).toBe("own-work");
    expect((await refusal(lib.rejectVersion(stella, v.id, "no"))).code).toBe("own-work");
  });

  it("copy then propose: the copier and the proposer are both contributors; a third person decides", async () => {
    const sam = await actorOf("steward");
    const stella = await actorOf("steward2");
    const alex = await actorOf("admin");
    const ref = await models().ModelVersion.findOne({ where: { teamId: null, status: "approved" }, order: [["id", "DESC"]] });
    const copy = await lib.copyReferenceVersion(sam, ref!.id);
    await lib.proposeVersion(stella, copy.id);
    expect((await refusal(lib.approveVersion(sam, copy.id))).message).toBe("You wrote this version: another steward must approve or reject it.");
    expect((await refusal(lib.approveVersion(stella, copy.id))).code).toBe("own-work");
    await expect(lib.approveVersion(alex, copy.id)).resolves.toMatchObject({ status: "approved" });
  });

  it("a new draft started from an unapproved version carries that version's contributors", async () => {
    const sam = await actorOf("steward");
    const erin = await actorOf("engineer");
    const stella = await actorOf("steward2");
    const v1 = await erinsDraft();
    await lib.editVersion(sam, v1.id, { lockVersion: 0, data: solid(555) });
    // Erin starts a fresh draft from the one Sam changed, and proposes it herself.
    const v2 = await lib.createVersion(erin, v1.modelId, { fromVersionId: v1.id });
    await lib.proposeVersion(erin, v2.id);
    expect((await refusal(lib.approveVersion(sam, v2.id))).code).toBe("own-work");
    await expect(lib.approveVersion(stella, v2.id)).resolves.toMatchObject({ status: "approved" });
    // Started from an approved version, the checked content brings nobody along.
    const v3 = await lib.createVersion(erin, v1.modelId, { fromVersionId: v2.id });
    expect((await lib.getVersion(erin, v3.id)).contributors.map((c) => [c.name, c.roles])).toEqual([["Erin Okafor", ["author"]]]);
  });

  it("records each contributor with their parts, keeps the audit events, and leaves the proposal out of their home count", async () => {
    const sam = await actorOf("steward");
    const stella = await actorOf("steward2");
    const erin = await actorOf("engineer");
    const v = await erinsDraft();
    await lib.editVersion(sam, v.id, { lockVersion: 0, changeNote: "first" });
    await lib.editVersion(sam, v.id, { lockVersion: 1, changeNote: "second" });
    const before = (await homeCounts(stella)).proposals;
    const samBefore = (await homeCounts(sam)).proposals;
    await lib.proposeVersion(erin, v.id);
    const dto = await lib.getVersion(erin, v.id);
    expect(dto.contributors.map((c) => [c.name, c.roles])).toEqual([
      ["Erin Okafor", ["author", "proposer"]],
      ["Sam Lindqvist", ["editor"]],
    ]);
    expect((await lib.versionAudit(erin, v.id)).map((e) => e.action)).toEqual(["model-version.created", "model-version.edited", "model-version.edited", "model-version.proposed"]);
    expect((await homeCounts(stella)).proposals).toBe(before + 1);
    expect((await homeCounts(sam)).proposals).toBe(samBefore);
  });
});

describe("cases have no editor path besides the author", () => {
  it("a reviewer-capable admin cannot edit someone else's case, so author ≠ reviewer covers every editor", async () => {
    const erin = await actorOf("engineer");
    const alex = await actorOf("admin");
    const input = caseInputSchema.parse(shiftCase(await ensureReferenceLibrary()));
    const c = await createCase(erin, input);
    const e = await refusal(updateCase(alex, c.id, { ...input, title: "Changed by Alex", lockVersion: c.lockVersion }));
    expect([e.status, e.code]).toEqual([403, "not-author"]);
  });
});
