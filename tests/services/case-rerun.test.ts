import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, models } from "@/lib/db";
import { createCase, getCase, getSnapshot, rerunWithNewerVersions, submitCase } from "@/lib/services/cases";
import { decideCase } from "@/lib/services/reviews";
import { caseInputSchema, decisionSchema } from "@/lib/validation/cases";
import { actorOf } from "../helpers/actors";
import { shiftCase } from "../helpers/cases";
import { freshDatabase } from "../helpers/db";
import { ensureReferenceLibrary, type RefFormula } from "../helpers/reference-library";

let pins: Record<RefFormula, number>;

beforeAll(async () => {
  await freshDatabase();
  pins = await ensureReferenceLibrary();
});
afterAll(() => closeDb());

/** A newer approved version of the H2 model (same published data; a new version number), superseding the pinned one. */
async function newerH2(): Promise<number> {
  const { ModelVersion } = models();
  const v1 = (await ModelVersion.findByPk(pins.H2))!;
  const latest = (await ModelVersion.max<number, typeof v1>("versionNumber", { where: { modelId: v1.modelId } })) ?? 1;
  const v2 = await ModelVersion.create({
    modelId: v1.modelId,
    teamId: v1.teamId,
    versionNumber: latest + 1,
    status: "approved",
    data: v1.data,
    citation: v1.citation,
    uncertainty: v1.uncertainty,
    changeNote: "re-approved for the re-run test",
    decisionReason: null,
    datasetId: null,
    authorId: null,
    decidedById: null,
    proposedAt: null,
    decidedAt: new Date(),
  });
  await v1.update({ status: "superseded" });
  return v2.id;
}

describe("newer approved versions", () => {
  it("an approved case says so and re-runs into a new submitted revision; the approved one stays readable", async () => {
    const erin = await actorOf("engineer");
    const rory = await actorOf("reviewer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins)));
    await submitCase(erin, c.id, 0);
    const approved = await decideCase(rory, c.id, decisionSchema.parse({ decision: "approved" }));
    expect(approved.newerVersions).toEqual([]);
    expect(approved.can.rerun).toBe(false);

    const v2 = await newerH2();
    const told = await getCase(erin, c.id);
    expect(told.newerVersions).toMatchObject([{ key: "H2(g)", pinnedVersionId: pins.H2, newerVersionId: v2 }]);
    expect(told.can.rerun).toBe(true);
    // Only the author re-runs.
    await expect(rerunWithNewerVersions(await actorOf("steward"), c.id, told.lockVersion)).rejects.toMatchObject({ status: 403 });

    const rerun = await rerunWithNewerVersions(erin, c.id, told.lockVersion);
    expect(rerun.status).toBe("submitted");
    expect(rerun.snapshots.map((s) => s.revision)).toEqual([1, 2]);
    expect(rerun.newerVersions).toEqual([]);
    const r2 = await getSnapshot(erin, c.id, 2);
    expect(r2.pins.find((p) => p.key === "H2(g)")!.versionId).toBe(v2);
    const r1 = await getSnapshot(erin, c.id, 1);
    expect(r1.pins.find((p) => p.key === "H2(g)")!.versionId).toBe(pins.H2);
    expect(r1.decision).toMatchObject({ decision: "approved" });
    expect(await models().AuditEvent.count({ where: { action: "case.repinned", entityId: String(c.id) } })).toBe(1);
    await expect(rerunWithNewerVersions(erin, c.id, rerun.lockVersion)).rejects.toMatchObject({ status: 409 });
  });
});
