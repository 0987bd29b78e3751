/**
 * Critical constants of a team species: set and removed by a steward or admin of the owning
 * team (audited), read-only for the reference library, refused when implausible, and picked up
 * by a Peng–Robinson case afterwards, both for a pinned species and for an unpinned inert one.
 */
import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as speciesOne from "@/app/api/v1/species/[id]/route";
import { closeDb, models } from "@/lib/db";
import { createCase, getResults } from "@/lib/services/cases";
import { getSpeciesCritical, setSpeciesCritical } from "@/lib/services/species-critical";
import { caseInputSchema } from "@/lib/validation/cases";
import { speciesPatchSchema } from "@/lib/validation/species-critical";
import { actorOf, signInAs } from "../helpers/actors";
import { shiftCase } from "../helpers/cases";
import { freshDatabase, tableCounts } from "../helpers/db";
import { hammer, hostileBody, nastyString, type Handler } from "../helpers/hostile";
import { bodyOf, ctx, jsonRequest } from "../helpers/request";
import { ensureReferenceLibrary, type RefFormula } from "../helpers/reference-library";

// n-Butane: Poling, Prausnitz & O'Connell, The Properties of Gases and Liquids, 5th ed., Appendix A (from memory).
const BUTANE = { tcK: 425.12, pcBar: 37.96, omega: 0.2, citation: "Poling, Prausnitz & O'Connell, 5th ed., Appendix A (from memory)" };
// Constant Cp of a gas with an anchor at 298.15 K: synthetic, invented for this test (not butane's real data).
const gasData = { segments: [{ phase: "g", form: "constant" as const, tminK: 250, tmaxK: 1500, coeffs: { cpJ: 100 } }], reference: { tK: 298.15, phase: "g", hkJ: -126, sJ: 310 } };

let pins: Record<RefFormula, number>;
let butaneId = 0;
let butaneVersion = 0;
beforeAll(async () => {
  await freshDatabase();
  pins = await ensureReferenceLibrary();
  const sam = await actorOf("steward");
  const { Species, CpModel, ModelVersion } = models();
  const s = await Species.create({ teamId: sam.teamId, formula: "C4H10", displayName: "n-Butane", elements: { C: 4, H: 10 }, molarMassGPerMol: 58.122, identifiers: null });
  butaneId = s.id;
  const m = await CpModel.create({
    speciesId: s.id,
    teamId: sam.teamId,
    name: "Butane (team, synthetic)",
    family: "custom",
    variant: null,
    copiedFromId: null,
    createdById: sam.userId,
  });
  const v = await ModelVersion.create({
    modelId: m.id,
    teamId: sam.teamId,
    versionNumber: 1,
    status: "approved",
    data: gasData,
    citation: "Synthetic, invented for this test",
    uncertainty: null,
    changeNote: null,
    decisionReason: null,
    datasetId: null,
    authorId: sam.userId,
    decidedById: null,
    proposedAt: null,
    decidedAt: new Date(),
  });
  butaneVersion = v.id;
});
afterAll(() => closeDb());

// Larkspur shift converter at 30 bar with butane riding along (invented demo scenario).
const feed = { "CO(g)": 13, "H2O(g)": 38, "CO2(g)": 6, "H2(g)": 40, "C4H10(g)": 3 };
const pinned = () => ({
  feed,
  feedUnit: "kmol/h",
  pressure: "30 bar",
  key: "CO(g)",
  reactions: [],
  extraTerms: [{ formula: "C4H10", phase: "g", versionId: butaneVersion }],
  inert: [],
  gas: "peng-robinson" as const,
});
const inert = () => ({ feed, feedUnit: "kmol/h", pressure: "30 bar", key: "CO(g)", reactions: [], extraTerms: [], inert: ["C4H10(g)"], gas: "peng-robinson" as const });

describe("who may set them", () => {
  it("a steward sets them; the species page reads them back with their source; one audit event", async () => {
    const sam = await actorOf("steward");
    const out = await setSpeciesCritical(sam, butaneId, { critical: BUTANE });
    expect(out).toEqual({ speciesId: butaneId, scope: "team", critical: BUTANE, canEdit: true });
    expect((await getSpeciesCritical(await actorOf("engineer"), butaneId)).canEdit).toBe(false);
    const audit = await models().AuditEvent.findOne({ where: { entityType: "species", entityId: String(butaneId), action: "species.critical-set" } });
    expect(audit!.after).toEqual({ formula: "C4H10", critical: BUTANE });
    expect(audit!.actorId).toBe(sam.userId);
  });

  it("over HTTP: PATCH answers { critical }, GET carries the same beside the species", async () => {
    await signInAs("steward");
    const patched = await (speciesOne.PATCH as Handler)(jsonRequest("PATCH", `/api/v1/species/${butaneId}`, { critical: BUTANE }), ctx({ id: String(butaneId) }));
    expect(patched.status).toBe(200);
    expect(await bodyOf(patched)).toEqual({ critical: { speciesId: butaneId, scope: "team", critical: BUTANE, canEdit: true } });
    await signInAs("engineer");
    const read = await (speciesOne.GET as Handler)(jsonRequest("GET", `/api/v1/species/${butaneId}`), ctx({ id: String(butaneId) }));
    expect(await bodyOf(read)).toMatchObject({ species: { id: butaneId, formula: "C4H10" }, critical: { critical: BUTANE, canEdit: false } });
  });

  it("an engineer is refused (403), another team's admin gets 404, the reference library is read-only", async () => {
    await expect(setSpeciesCritical(await actorOf("engineer"), butaneId, { critical: BUTANE })).rejects.toMatchObject({ status: 403, code: "forbidden" });
    await expect(setSpeciesCritical(await actorOf("other"), butaneId, { critical: BUTANE })).rejects.toMatchObject({ status: 404, code: "not-found" });
    await expect(getSpeciesCritical(await actorOf("other"), butaneId)).rejects.toMatchObject({ status: 404 });
    const n2 = await models().Species.findOne({ where: { teamId: null, formula: "N2" } });
    await expect(setSpeciesCritical(await actorOf("admin"), n2!.id, { critical: null })).rejects.toMatchObject({ status: 403, code: "read-only" });
    const ref = await getSpeciesCritical(await actorOf("admin"), n2!.id);
    expect(ref).toMatchObject({ scope: "reference", canEdit: false, critical: { tcK: 126.2, pcBar: 33.98, omega: 0.037 } });
  });
});

describe("refusals", () => {
  const base = { ...BUTANE };
  it.each([
    ["Tc at 0 K", { ...base, tcK: 0 }, "critical.tcK", "A critical temperature must be above 0 K."],
    ["a negative pc", { ...base, pcBar: -3 }, "critical.pcBar", "A critical pressure must be above 0 bar."],
    ["Tc of 6000 K", { ...base, tcK: 6000 }, "critical.tcK", "A critical temperature above 5000 K is not plausible."],
    ["ω of 3", { ...base, omega: 3 }, "critical.omega", "An acentric factor runs from -1 to 2."],
    ["no source", { ...base, citation: " " }, "critical.citation", "Name the source of the constants."],
    ["Tc as text", { ...base, tcK: "425" }, "critical.tcK", "Enter the critical temperature as a number."],
  ])("%s", (_label, critical, path, message) => {
    const r = speciesPatchSchema.safeParse({ critical });
    expect(r.success).toBe(false);
    expect(r.error!.issues.map((i) => [i.path.join("."), i.message])).toContainEqual([path, message]);
  });

  it("an unknown field is refused, at the top and inside the constants", () => {
    expect(speciesPatchSchema.safeParse({ critical: { ...base, tc: 1 } }).success).toBe(false);
    expect(speciesPatchSchema.safeParse({ critical: base, note: "x" }).success).toBe(false);
  });

  it("generated hostile bodies never get a 5xx and write nothing", async () => {
    const before = await tableCounts();
    const never = fc.oneof(fc.double({ max: 0 }), fc.double({ min: 5000.001, noNaN: true }), nastyString, fc.constant(null), fc.boolean());
    const badCritical = fc.oneof(
      fc.record({ tcK: never, pcBar: fc.double(), omega: fc.double(), citation: fc.string() }, { requiredKeys: [] }),
      nastyString,
      fc.integer(),
      fc.array(fc.double()),
    );
    await hammer(
      "species critical",
      "steward",
      speciesOne.PATCH as Handler,
      `/api/v1/species/${butaneId}`,
      "PATCH",
      { id: String(butaneId) },
      hostileBody({ critical: badCritical }, { exact: true }),
      200,
    );
    expect(await tableCounts()).toEqual(before);
  });
});

describe("a Peng–Robinson case picks the team species' constants up", () => {
  it("without them, a case with the species is refused naming it; with them it is evaluated", async () => {
    const sam = await actorOf("steward");
    const erin = await actorOf("engineer");
    await setSpeciesCritical(sam, butaneId, { critical: null });
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { equilibrium: pinned() })));
    await expect(getResults(erin, c.id)).rejects.toMatchObject({ code: "missing-critical", message: expect.stringContaining('"C4H10(g)" has none') });

    await setSpeciesCritical(sam, butaneId, { critical: BUTANE });
    const r = await getResults(erin, c.id);
    expect(r.request.species["C4H10(g)"].critical).toEqual({ tcK: 425.12, pcBar: 37.96, omega: 0.2 });
    expect(r.result.equilibriumInfo!.gas).toBe("peng-robinson");
    const phi = r.result.equilibrium![0].fugacityCoefficients["C4H10(g)"];
    // A heavier gas at 30 bar and 480 K sits below φ = 1 (attraction dominates): common practice.
    expect(phi).toBeGreaterThan(0.5);
    expect(phi).toBeLessThan(1);

    // Changed constants reach the live draft on its next evaluation.
    await setSpeciesCritical(sam, butaneId, { critical: { ...BUTANE, tcK: 400 } });
    const again = await getResults(erin, c.id);
    expect(again.request.species["C4H10(g)"].critical!.tcK).toBe(400);
    expect(again.result.equilibrium![0].fugacityCoefficients["C4H10(g)"]).not.toBeCloseTo(phi, 6);
  });

  it("an unpinned inert butane takes the team's constants by formula", async () => {
    const sam = await actorOf("steward");
    const erin = await actorOf("engineer");
    await setSpeciesCritical(sam, butaneId, { critical: BUTANE });
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { equilibrium: inert() })));
    const r = await getResults(erin, c.id);
    expect(r.request.equilibrium!.critical).toEqual({ "C4H10(g)": { tcK: 425.12, pcBar: 37.96, omega: 0.2 } });
    expect(r.result.equilibrium![0].fugacityCoefficients["C4H10(g)"]).toBeLessThan(1);
  });
});
