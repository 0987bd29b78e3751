/**
 * Equilibrium in cases: the request a case builds, the frozen snapshot, the CSV export, and
 * the source comparison over the approved reference families.
 */
import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { createCase, exportCsv, getResults, getSnapshot, submitCase } from "@/lib/services/cases";
import { previewCaseEquilibrium, saveCaseEquilibrium } from "@/lib/services/case-equilibrium";
import { compareFamilies } from "@/lib/services/equilibrium";
import { evaluate } from "@/lib/thermo";
import { caseInputSchema } from "@/lib/validation/cases";
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

// Larkspur Hydrogen Works shift converter (invented demo scenario): steam-to-CO 3, 30 bar.
const equilibrium = {
  feed: { "CO(g)": 1, "H2O(g)": 3, "CO2(g)": 0.1, "H2(g)": 0.5 },
  feedUnit: "kmol/h",
  pressure: "30 bar",
  key: "CO(g)" as string | null,
  reactions: [],
  extraTerms: [],
  inert: [] as string[],
};

describe("a case with an equilibrium", () => {
  it("builds the request, freezes the composition in the snapshot and exports it", async () => {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { equilibrium })));
    const live = await getResults(erin, c.id);
    expect(live.request.equilibrium).toEqual({ feed: equilibrium.feed, feedUnit: "kmol/h", pressureBar: "30 bar", key: "CO(g)" });
    expect(live.result).toEqual(JSON.parse(JSON.stringify(evaluate(live.request))));
    expect(live.result.equilibrium).toHaveLength(live.result.points.length);
    expect(live.result.equilibriumInfo).toMatchObject({ pressureBar: 30, feedUnit: "kmol/h" });

    const submitted = await submitCase(erin, c.id, c.lockVersion);
    const snap = await getSnapshot(erin, c.id, 1);
    expect(snap.result.equilibrium).toEqual(live.result.equilibrium);
    expect(submitted.status).toBe("submitted");

    const { csv } = await exportCsv(erin, c.id);
    const [header, ...rows] = Papa.parse<string[]>(csv.trim(), { skipEmptyLines: true }).data;
    const col = (h: string) => header.indexOf(h);
    expect(col("equilibrium.keyFraction")).toBeGreaterThan(0);
    expect(col("equilibrium.naive.moleFractions.CO(g)")).toBeGreaterThan(0);
    rows.forEach((row, i) => {
      const p = snap.result.equilibrium![i];
      expect(Number(row[col("equilibrium.keyFraction")])).toBe(p.keyFraction);
      expect(Number(row[col("equilibrium.keyFractionDiff")])).toBe(p.keyFractionDiff);
      expect(Number(row[col("equilibrium.moles.H2(g)")])).toBe(p.moles["H2(g)"]);
      expect(Number(row[col("equilibrium.extents[0]")])).toBe(p.extents[0]);
    });
  });
  it("refuses a feed without a positive amount, writing nothing", async () => {
    const erin = await actorOf("engineer");
    const before = await tableCounts();
    const parsed = caseInputSchema.safeParse(shiftCase(pins, { equilibrium: { ...equilibrium, feed: { "CO(g)": 0 }, key: null } }));
    expect(parsed.success).toBe(false);
    expect(parsed.error!.issues.map((i) => [i.path.join("."), i.message])).toContainEqual(["equilibrium.feed", "Give at least one species a positive amount."]);
    expect(await tableCounts()).toEqual(before);
    void erin;
  });
});

describe("sources side by side over the approved families", () => {
  it("runs every family that covers the species and reports the spread", async () => {
    const erin = await actorOf("engineer");
    const request = {
      reaction: "CO(g) + H2O(g) -> CO2(g) + H2(g)",
      species: { "CO(g)": {}, "H2O(g)": {}, "CO2(g)": {}, "H2(g)": {} },
      temperatures: { listK: [600, 700] },
      equilibrium: { feed: { "CO(g)": 1, "H2O(g)": 3 }, pressureBar: 30 },
    };
    const out = await compareFamilies(erin, async () => request);
    expect(out.families.length).toBeGreaterThanOrEqual(2);
    expect(out.comparison!.variants.map((v) => v.label)).toEqual(out.families.map((f) => f.family));
    const variants = out.comparison!.variants;
    out.comparison!.spread.forEach((row, i) => {
      // The spread is max − min over the families' own outlet rows, recomputed here from each variant.
      const fractions = variants.map((v) => v.result.equilibrium![i].keyFraction!);
      expect(row.keyFraction!.range).toBeCloseTo(Math.max(...fractions) - Math.min(...fractions), 12);
      expect(row.keyFraction!.range).toBeGreaterThan(0);
      // Published sets of different families agree on the shift's log10 K within 0.1 (shared/reference README: 0.05 each vs JANAF).
      expect(row.log10K.range).toBeLessThan(0.1);
    });
  });
});

describe("the reformer with shift as a case (invented demo scenario)", () => {
  const reformer = () =>
    shiftCase(pins, {
      title: "Larkspur reformer outlet",
      terms: [
        { formula: "CH4", phase: "g", coefficient: -1, versionId: pins.CH4 },
        { formula: "H2O", phase: "g", coefficient: -1, versionId: pins.H2O },
        { formula: "CO", phase: "g", coefficient: 1, versionId: pins.CO },
        { formula: "H2", phase: "g", coefficient: 3, versionId: pins.H2 },
      ],
      temperatures: { fromK: 900, toK: 1200, stepK: 50 },
    });
  const eq = {
    feed: { "CH4(g)": 1, "H2O(g)": 3 },
    feedUnit: "kmol/h",
    pressure: "25 bar",
    key: "CH4(g)",
    reactions: ["CH4(g) + H2O(g) -> CO(g) + 3 H2(g)", "CO(g) + H2O(g) -> CO2(g) + H2(g)"],
    extraTerms: [{ formula: "CO2", phase: "g", versionId: 0 }],
  };
  it("previews, saves with an extra pin for CO2, and the results carry both reactions", async () => {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(reformer()));
    const withPin = { ...eq, extraTerms: [{ formula: "CO2", phase: "g", versionId: pins.CO2 }] };
    const trial = await previewCaseEquilibrium(erin, async () => ({ caseId: c.id, equilibrium: withPin }));
    expect(trial.equilibrium![0].extents).toHaveLength(2);
    expect(trial.equilibrium!.every((p) => p.converged)).toBe(true);
    const saved = await saveCaseEquilibrium(erin, c.id, async () => ({ lockVersion: c.lockVersion, equilibrium: withPin }));
    expect(saved.inputs.equilibrium).toMatchObject({ key: "CH4(g)", reactions: eq.reactions });
    expect(saved.pins.map((p) => p.key)).toContain("CO2(g)");
    const live = await getResults(erin, c.id);
    expect(live.result.equilibrium).toEqual(trial.equilibrium);
  });
  it("refuses a reviewer's save and another author's save, and an extra pin that does not exist", async () => {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(reformer()));
    const before = await tableCounts();
    await expect(saveCaseEquilibrium(await actorOf("reviewer"), c.id, async () => ({ lockVersion: 0, equilibrium: null }))).rejects.toMatchObject({ status: 403 });
    await expect(saveCaseEquilibrium(await actorOf("steward"), c.id, async () => ({ lockVersion: 0, equilibrium: null }))).rejects.toMatchObject({ status: 403 });
    await expect(
      saveCaseEquilibrium(erin, c.id, async () => ({ lockVersion: 0, equilibrium: { ...eq, extraTerms: [{ formula: "CO2", phase: "g", versionId: 999999 }] } })),
    ).rejects.toMatchObject({
      status: 422,
    });
    await expect(previewCaseEquilibrium(await actorOf("other"), async () => ({ caseId: c.id, equilibrium: { feed: eq.feed } }))).rejects.toMatchObject({ status: 404 });
    expect(await tableCounts()).toEqual(before);
  });
});

describe("demo data (invented Larkspur Hydrogen Works cases)", () => {
  it.each(["Reformer outlet near 1100 K", "Shift converter 480–700 K", "Ammonia loop near 700 K"])("%s carries a converged equilibrium", async (title) => {
    const erin = await actorOf("engineer");
    const { models } = await import("@/lib/db");
    const row = await models().Case.findOne({ where: { title } });
    expect(row, `seeded case ${title}`).not.toBeNull();
    const r = await getResults(erin, row!.id);
    expect(r.result.equilibrium!.length).toBe(r.result.points.length);
    expect(r.result.equilibrium!.every((p) => p.converged && p.naive.converged)).toBe(true);
    expect(r.result.uncertainty).toBeDefined();
  });
});
