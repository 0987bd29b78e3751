/**
 * Real gas and the adiabatic outlet in cases: the seeded critical constants of the reference
 * species (cited), the request a case builds (constants only with a real gas, inert species'
 * constants looked up by formula), the adiabatic inlet, and the two seeded demo drafts.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, models } from "@/lib/db";
import { cautionText } from "@/lib/cases/caution";
import { createCase, exportCsv, getResults, submitCase } from "@/lib/services/cases";
import { decideCase } from "@/lib/services/reviews";
import { compareFamilies } from "@/lib/services/equilibrium";
import { previewCaseEquilibrium } from "@/lib/services/case-equilibrium";
import { caseInputSchema, decisionSchema } from "@/lib/validation/cases";
import { CRITICAL_CONSTANTS } from "@/seeders/critical-constants";
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

// Larkspur Hydrogen Works shift converter (invented demo scenario).
const eq = {
  feed: { "CO(g)": 13, "H2O(g)": 38, "CO2(g)": 6, "H2(g)": 40, "CH4(g)": 3 },
  feedUnit: "kmol/h",
  pressure: "30 bar",
  key: "CO(g)" as string | null,
  reactions: [],
  extraTerms: [],
  inert: ["CH4(g)"],
};

describe("critical constants in the library", () => {
  it("every reference species carries them, cited (Poling, Prausnitz & O'Connell, 5th ed., from memory)", async () => {
    for (const [formula, c] of Object.entries(CRITICAL_CONSTANTS)) {
      const s = await models().Species.findOne({ where: { teamId: null, formula } });
      expect(s!.critical).toMatchObject(c);
      expect(s!.critical!.citation).toMatch(/Poling, B\. E\., Prausnitz.*5th ed\..*from memory/);
    }
  });
});

describe("the request a case builds", () => {
  it("an ideal-gas case is unchanged: no critical constants, no gas field", async () => {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { equilibrium: eq })));
    const r = await getResults(erin, c.id);
    for (const entry of Object.values(r.request.species)) expect(entry).not.toHaveProperty("critical");
    expect(r.request.equilibrium).not.toHaveProperty("gas");
    expect(r.request.equilibrium).not.toHaveProperty("critical");
    expect(r.request).not.toHaveProperty("adiabatic");
  });

  it("a Peng–Robinson case passes the pinned species' constants and looks up the inert one's", async () => {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { equilibrium: { ...eq, gas: "peng-robinson" } })));
    const r = await getResults(erin, c.id);
    const { tcK, pcBar, omega } = CRITICAL_CONSTANTS.CO;
    expect(r.request.species["CO(g)"].critical).toEqual({ tcK, pcBar, omega });
    expect(r.request.equilibrium!.gas).toBe("peng-robinson");
    expect(r.request.equilibrium!.critical).toEqual({ "CH4(g)": { tcK: 190.56, pcBar: 45.99, omega: 0.011 } });
    expect(r.result.equilibriumInfo!.gas).toBe("peng-robinson");
    const p = r.result.equilibrium![0];
    // Common practice: dilute methane at a shift converter's temperature and pressure is close to ideal (φ near 1).
    expect(p.fugacityCoefficients["CH4(g)"]).toBeGreaterThan(0.9);
    expect(p.ideal).toBeDefined();
    expect(r.result.warnings.map((w) => w.code)).not.toContain("high-pressure");
  });

  it("an adiabatic inlet needs the inert species pinned; with it the outlet temperature comes back", async () => {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { equilibrium: eq })));
    await expect(previewCaseEquilibrium(erin, async () => ({ caseId: c.id, equilibrium: { ...eq, adiabaticInletK: 600 } }))).rejects.toMatchObject({
      code: "missing-species",
      message: 'species "CH4(g)" is in equilibrium.feed and carries heat in the adiabatic balance, but has no entry in species',
    });
    // Pinned, methane is an extra species of the case rather than a stated inert.
    const withPin = { ...eq, adiabaticInletK: "326.85 degC", extraTerms: [{ formula: "CH4", phase: "g", versionId: pins.CH4 }], inert: [] };
    const result = await previewCaseEquilibrium(erin, async () => ({ caseId: c.id, equilibrium: withPin }));
    expect(result.adiabatic!.inletK).toBeCloseTo(600, 9);
    // Derived as in tests/thermo/adiabatic.test.ts (the same converter feed heats by about 100 K from 600 K).
    expect(result.adiabatic!.outletK).toBeGreaterThan(650);
  });
});

describe("sources and CSV with a real gas", () => {
  it("the family comparison carries the library's critical constants, so a Peng–Robinson request compares", async () => {
    const erin = await actorOf("engineer");
    const body = {
      reaction: "N2(g) + 3 H2(g) -> 2 NH3(g)",
      species: { "N2(g)": {}, "H2(g)": {}, "NH3(g)": {} },
      temperatures: { listK: [700] },
      equilibrium: { feed: { "N2(g)": 1, "H2(g)": 3 }, pressureBar: 300, gas: "peng-robinson" },
    };
    const r = await compareFamilies(erin, async () => body);
    expect(r.families.length).toBeGreaterThanOrEqual(2);
    expect(r.comparison).not.toBeNull();
  });

  it("the CSV of a Peng–Robinson case adds φ per gas species and the ideal-gas conversion", async () => {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { equilibrium: { ...eq, gas: "peng-robinson" } })));
    const { csv } = await exportCsv(erin, c.id);
    const header = csv.split("\n")[0];
    expect(header).toContain("equilibrium.fugacityCoefficients.CO(g)");
    expect(header).toContain("equilibrium.fugacityCoefficients.CH4(g)");
    expect(header).toContain("equilibrium.ideal.keyConversion");
    const ideal = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { equilibrium: eq })));
    expect((await exportCsv(erin, ideal.id)).csv.split("\n")[0]).not.toContain("fugacityCoefficients");
  });
});

describe("seeded demo drafts (invented Larkspur scenario)", () => {
  it("the shift bed and the ammonia bed give an adiabatic rise with Peng–Robinson fugacities", async () => {
    const erin = await actorOf("engineer");
    for (const title of ["Shift converter bed temperature rise", "Ammonia bed temperature rise at 150 bar"]) {
      const row = await models().Case.findOne({ where: { title } });
      const r = await getResults(erin, row!.id);
      expect(r.source).toBe("live");
      expect(r.result.equilibriumInfo!.gas).toBe("peng-robinson");
      const a = r.result.adiabatic!;
      // Common practice: both exothermic beds heat by well over 50 K on the demo feeds; the sign is the point.
      expect(a.riseK).toBeGreaterThan(50);
      expect(a.bracketK[0]).toBeLessThanOrEqual(a.outletK);
      expect(a.bracketK[1]).toBeGreaterThanOrEqual(a.outletK);
      expect(Number.isFinite(a.naiveOutletK)).toBe(true);
    }
  });
});

describe("the caution of a Peng–Robinson case's mails", () => {
  it("the review request and the decision say fugacity coefficients, not ideal-gas activities", async () => {
    const erin = await actorOf("engineer");
    const c = await createCase(erin, caseInputSchema.parse(shiftCase(pins, { title: "Shift at 30 bar, real gas (caution mail)", equilibrium: { ...eq, gas: "peng-robinson" } })));
    await submitCase(erin, c.id, c.lockVersion);
    await decideCase(await actorOf("reviewer"), c.id, decisionSchema.parse({ decision: "returned", reason: "Add the start-up span." }));
    const mails = await models().MailMessage.findAll({ where: { kind: ["review-requested", "review-decided"] } });
    const ours = mails.filter((m) => m.subject.includes("Shift at 30 bar, real gas (caution mail)"));
    expect([...new Set(ours.map((m) => m.kind))].sort()).toEqual(["review-decided", "review-requested"]);
    for (const m of ours) {
      expect(m.body).toContain(cautionText("peng-robinson"));
      expect(m.body).not.toContain("ideal-gas activities");
    }
  });
});
