/**
 * What a model change does to every pinned case: the background job queued on propose and on
 * approve, its progress, the per-case figures against an exact expectation (a version whose
 * only change is ΔfH° shifted by a known amount), tolerances, crossovers and sign cases,
 * one mail per author after approval, permissions, and that the request itself evaluates nothing.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, models } from "@/lib/db";
import { createCase } from "@/lib/services/cases";
import { getImpact, runQueuedImpactJobs, startImpact } from "@/lib/services/impact";
import { approveVersion, proposeVersion } from "@/lib/services/library";
import type { SpeciesInput } from "@/lib/thermo";
import { caseInputSchema } from "@/lib/validation/cases";
import { actorOf } from "../helpers/actors";
import { shiftCase } from "../helpers/cases";
import { freshDatabase } from "../helpers/db";
import { ensureReferenceLibrary, type RefFormula } from "../helpers/reference-library";

const R = 8.314462618;
let pins: Record<RefFormula, number>;
let v1: number;
let v2: number;
let caseIds: number[];

/** The CO data with ΔfH° raised by `dHkJ` (NASA-7 a6 carries H/R): synthetic, invented for this test. */
function shifted(data: SpeciesInput, dHkJ: number): SpeciesInput {
  return {
    ...data,
    segments: data.segments.map((s) => (s.form === "nasa7" ? { ...s, coeffs: (s.coeffs as number[]).map((c, i) => (i === 5 ? c + (dHkJ * 1000) / R : c)) } : s)),
  };
}

beforeAll(async () => {
  await freshDatabase();
  pins = await ensureReferenceLibrary();
  const sam = await actorOf("steward");
  const erin = await actorOf("engineer");
  const ref = await models().ModelVersion.findByPk(pins.CO);
  const refModel = await models().CpModel.findByPk(ref!.modelId);
  // A Larkspur model of CO: v1 approved (the reference data), v2 a draft whose ΔfH° is 0.6 kJ/mol higher.
  const model = await models().CpModel.create({
    speciesId: refModel!.speciesId,
    teamId: sam.teamId,
    name: "CO · Larkspur working set (invented)",
    family: "custom",
    variant: null,
    copiedFromId: null,
    createdById: sam.userId,
  });
  const common = {
    modelId: model.id,
    teamId: sam.teamId,
    citation: "Copied from the reference set (test)",
    uncertainty: null,
    changeNote: null,
    decisionReason: null,
    datasetId: null,
    decidedById: null,
    proposedAt: null,
  };
  v1 = (await models().ModelVersion.create({ ...common, versionNumber: 1, status: "approved", data: ref!.data, authorId: sam.userId, decidedAt: new Date() })).id;
  v2 = (await models().ModelVersion.create({ ...common, versionNumber: 2, status: "draft", data: shifted(ref!.data as SpeciesInput, 0.6), authorId: erin.userId, decidedAt: null }))
    .id;
  const withV1 = { ...pins, CO: v1 };
  // Two cases by Erin (tolerance 1 and 0.5 kJ/mol), one by Sam, one untouched (reference CO).
  const a = await createCase(erin, caseInputSchema.parse(shiftCase(withV1, { title: "Shift on the working set", toleranceKJ: 1 })));
  const b = await createCase(
    erin,
    caseInputSchema.parse(shiftCase(withV1, { title: "Shift, tight tolerance", toleranceKJ: 0.5, temperatures: { fromK: 900, toK: 1200, stepK: 50 } })),
  );
  const c = await createCase(sam, caseInputSchema.parse(shiftCase(withV1, { title: "Sam's shift check", toleranceKJ: 1 })));
  await createCase(erin, caseInputSchema.parse(shiftCase(pins, { title: "Shift on the reference set" })));
  caseIds = [a.id, b.id, c.id];
});
afterAll(() => closeDb());

describe("impact of a new version on the pinned cases", () => {
  it("proposing queues a job; the request evaluates nothing and the page sees it queued", async () => {
    const erin = await actorOf("engineer");
    await proposeVersion(erin, v2);
    const before = await getImpact(erin, v2);
    expect(before.job).toMatchObject({ status: "queued", trigger: "proposed", done: 0 });
    expect(before.cases).toEqual([]);
    // Starting again while one is queued returns the same job.
    const again = await startImpact(erin, v2);
    expect(again.job!.id).toBe(before.job!.id);
  });

  it("the job re-evaluates exactly the cases pinned to an older version, with the exact ΔrG change", async () => {
    expect(await runQueuedImpactJobs()).toBe(1);
    const r = await getImpact(await actorOf("reviewer"), v2);
    expect(r.job).toMatchObject({ status: "done", total: 3, done: 3 });
    expect(r.cases.map((c) => c.caseId)).toEqual(caseIds);
    for (const c of r.cases) {
      // CO is a reactant (ν = −1): ΔrG falls by exactly 0.6 kJ/mol at every T.
      expect(c.maxDiffKJ).toBeCloseTo(0.6, 9);
      expect(c.pinnedVersionNumbers).toEqual([1]);
      expect(c.signCaseBefore).toBe(c.signCaseAfter);
      expect(c.error).toBeNull();
    }
    // log10 K changes by 0.6 kJ/mol / (RT ln 10): largest at the lowest T of each grid.
    expect(r.cases[0].maxDiffLog10K).toBeCloseTo(600 / (R * 480 * Math.LN10), 9);
    expect(r.cases[1].maxDiffLog10K).toBeCloseTo(600 / (R * 900 * Math.LN10), 9);
    expect(r.cases.map((c) => c.exceedsTolerance)).toEqual([false, true, false]);
    // A higher ΔfH°(CO) makes ΔrG more negative, so the shift's crossover near 1100 K moves up.
    const wide = r.cases[1];
    expect(wide.crossoversBefore).toHaveLength(1);
    expect(wide.crossoversAfter).toHaveLength(1);
    expect(wide.crossoversAfter[0]).toBeGreaterThan(wide.crossoversBefore[0]);
  });

  it("approving queues a second run that mails each author of an affected case once, listing their cases", async () => {
    const stella = await actorOf("steward2");
    await approveVersion(stella, v2);
    const mailsBefore = await models().MailMessage.count({ where: { kind: "model-impact" } });
    expect(mailsBefore).toBe(0);
    expect(await runQueuedImpactJobs()).toBe(1);
    const mails = await models().MailMessage.findAll({ where: { kind: "model-impact" }, order: [["id", "ASC"]] });
    expect(mails.map((m) => m.recipients[0]).sort()).toEqual(["erin.engineer@example.test", "sam.steward@example.test"]);
    const erinMail = mails.find((m) => m.recipients[0] === "erin.engineer@example.test")!;
    expect(erinMail.subject).toBe("CO · Larkspur working set (invented) v2 was approved: 2 of your cases pin an older version");
    expect(erinMail.body).toContain("Shift on the working set");
    expect(erinMail.body).toContain("Shift, tight tolerance");
    expect(erinMail.body).toContain("beyond the case's tolerance");
    expect(erinMail.body).not.toContain("Sam's shift check");
    expect(erinMail.body).not.toContain("Shift on the reference set");
    const job = await models().ImpactJob.findOne({ where: { versionId: v2, trigger: "approved" } });
    expect(job!.notifiedAt).not.toBeNull();
  });

  it("who may see and start it: reviewers read, only drafting roles start, another team gets 404", async () => {
    await expect(startImpact(await actorOf("reviewer"), v2)).rejects.toMatchObject({ status: 403 });
    await expect(getImpact(await actorOf("other"), v2)).rejects.toMatchObject({ status: 404 });
    await expect(getImpact(null, v2)).rejects.toMatchObject({ status: 401 });
    const started = await startImpact(await actorOf("admin"), v2);
    expect(started.job).toMatchObject({ status: "queued", trigger: "manual" });
    await runQueuedImpactJobs();
  });

  it("a version that cannot evaluate a case flags it with the engine's message", async () => {
    const sam = await actorOf("steward");
    const v = await models().ModelVersion.findByPk(v2);
    // v3 has a gap in its gas chain between 600 and 700 K (synthetic): the engine refuses it for every case.
    const [lo, hi] = (v!.data as SpeciesInput).segments;
    const short = {
      ...(v!.data as SpeciesInput),
      segments: [
        { ...lo, tmaxK: 600 },
        { ...hi, tminK: 700 },
      ],
    };
    const v3 = await models().ModelVersion.create({
      modelId: v!.modelId,
      teamId: sam.teamId,
      versionNumber: 3,
      status: "proposed",
      data: short,
      citation: "test",
      uncertainty: null,
      changeNote: null,
      decisionReason: null,
      datasetId: null,
      authorId: sam.userId,
      decidedById: null,
      proposedAt: new Date(),
      decidedAt: null,
    });
    await startImpact(sam, v3.id);
    await runQueuedImpactJobs();
    const r = await getImpact(sam, v3.id);
    expect(r.job!.status).toBe("done");
    // The three cases still pin v1 (the reference-pinned one is not of this model).
    expect(r.cases).toHaveLength(3);
    for (const c of r.cases) {
      expect(c.pinnedVersionNumbers).toEqual([1]);
      expect(c.error).toMatch(/^version 3 cannot evaluate this case: species "CO\(g\)": gap in the g chain between 600 K and 700 K/);
      expect(c.exceedsTolerance).toBe(true);
      expect(c.maxDiffKJ).toBeNull();
    }
  });
});
