/**
 * Taking back library work (issue 11, item 15): the author or a steward withdraws a proposal
 * to a draft, or deletes a draft or proposal; decided versions and pinned ones stay.
 * Numbers are synthetic, invented for this test.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, models } from "@/lib/db";
import * as lib from "@/lib/services/library";
import { deleteVersion, withdrawProposal } from "@/lib/services/library-drafts";
import { createCase } from "@/lib/services/cases";
import { caseInputSchema } from "@/lib/validation/cases";
import { actorOf } from "../helpers/actors";
import { shiftCase } from "../helpers/cases";
import { freshDatabase } from "../helpers/db";
import { createDraft, uniqueName } from "../helpers/library";
import { ensureReferenceLibrary } from "../helpers/reference-library";
import { refusal } from "../helpers/refusal";

beforeAll(() => freshDatabase());
afterAll(() => closeDb());

const draftBy = (who: "steward" | "engineer") => createDraft(who, uniqueName("Take-back"));

describe("withdraw and delete", () => {
  it("the author withdraws a proposal back to a draft; it leaves the queue and the trail says so", async () => {
    const erin = await actorOf("engineer");
    const { version } = await draftBy("engineer");
    await lib.proposeVersion(erin, version.id);
    const back = await withdrawProposal(erin, version.id);
    expect(back).toMatchObject({ status: "draft", proposedAt: null });
    expect((await lib.versionAudit(erin, version.id)).map((a) => a.action)).toEqual(["model-version.created", "model-version.proposed", "model-version.withdrawn"]);
    expect((await refusal(withdrawProposal(erin, version.id))).status).toBe(409);
  });

  it("someone else's work needs a steward; a reviewer or another team cannot touch it", async () => {
    const { version } = await draftBy("steward");
    expect((await refusal(deleteVersion(await actorOf("engineer"), version.id))).status).toBe(403);
    expect((await refusal(deleteVersion(await actorOf("reviewer"), version.id))).status).toBe(403);
    expect((await refusal(deleteVersion(await actorOf("other"), version.id))).status).toBe(404);
    const done = await deleteVersion(await actorOf("steward2"), version.id);
    expect(done.deleted).toMatchObject({ versionId: version.id, modelDeleted: true });
    expect(await models().ModelVersion.findByPk(version.id)).toBeNull();
    expect(await models().CpModel.findByPk(version.modelId)).toBeNull();
    const trail = await models().AuditEvent.findAll({ where: { entityType: "model-version", entityId: String(version.id) } });
    expect(trail.map((a) => a.action)).toContain("model-version.deleted");
  });

  it("a decided version stays, and a version a case pins cannot be deleted", async () => {
    const sam = await actorOf("steward");
    const stella = await actorOf("steward2");
    const { version } = await draftBy("steward");
    await lib.proposeVersion(sam, version.id);
    await lib.approveVersion(stella, version.id);
    expect((await refusal(deleteVersion(sam, version.id))).status).toBe(409);

    const pins = await ensureReferenceLibrary();
    const erin = await actorOf("engineer");
    // A team draft of CO (a copy of the reference version) pinned by a draft case, allowed with a warning.
    const teamDraft = await lib.copyReferenceVersion(sam, pins.CO);
    await createCase(erin, caseInputSchema.parse(shiftCase({ ...pins, CO: teamDraft.id })));
    const e = await refusal(deleteVersion(sam, teamDraft.id));
    expect(e.status).toBe(409);
    expect(e.message).toMatch(/^Cases pin this version \(“Shift converter check”\); re-pin them before deleting it\.$/);
  });
});
