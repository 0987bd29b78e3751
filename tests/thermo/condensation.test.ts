/**
 * Species' normal boiling and triple points: `below-boiling-point` when a gas chain is used
 * below the boiling point, and `condensed-phase-possible` for an equilibrium species below it.
 * Coefficient sets: third-millennium NASA-7, 2015 update (../shared/reference/cp-coefficients.json).
 * Bounds of 1e-6 and tighter compare two computations of one number (closed form, independent
 * solver, unit round trip): round-off allowances, common practice.
 */
import { describe, expect, it } from "vitest";
import { evaluate, EngineRefusal, type SpeciesInput } from "@/lib/thermo";
import { condensationWarnings } from "@/lib/thermo/condensation";
import { speciesEntry } from "./reference-data";

// CRC Handbook of Chemistry and Physics, normal boiling points and triple points (from memory).
const CH4 = { boilingPointK: 111.66, triplePointK: 90.69 };
const H2O = { boilingPointK: 373.12, triplePointK: 273.16 };

const coldBox = (extra: Record<string, unknown> = {}): { species: Record<string, SpeciesInput> } & Record<string, unknown> => ({
  reaction: "CO(g) + 3 H2(g) -> CH4(g) + H2O(cr)",
  species: {
    "CO(g)": speciesEntry("nasa7-2015", "CO", "g"),
    "H2(g)": speciesEntry("nasa7-2015", "H2", "g"),
    "CH4(g)": { ...speciesEntry("nasa7-2015", "CH4", "g"), ...CH4 },
    "H2O(cr)": { ...speciesEntry("nasa7-2015", "H2O", "cr"), ...H2O },
  },
  temperatures: { fromK: 80, toK: 120, stepK: 1 },
  ...extra,
});

describe("below-boiling-point", () => {
  it("flags the cold box's CH4(g) from 80 K to 111 K, naming the boiling and triple points", () => {
    const r = evaluate(coldBox());
    const w = r.warnings.filter((x) => x.code === "below-boiling-point");
    expect(w).toHaveLength(1);
    expect(w[0]).toMatchObject({ species: "CH4(g)", tK: 80, toK: 111, boilingPointK: 111.66, triplePointK: 90.69 });
    expect(w[0].message).toBe(
      "used as a gas from 80 K to 111 K, below its normal boiling point of 111.66 K; at 1 atm the pure substance is condensed there (solid below its 90.69 K triple point), and the gas values are those of a hypothetical ideal gas",
    );
    // A condensed marker is not a gas: H2O(cr) gets none, although 80 K is below 373.12 K.
    expect(w.some((x) => x.species === "H2O(cr)")).toBe(false);
  });

  it("says nothing above the boiling point or without one", () => {
    expect(evaluate(coldBox({ temperatures: { fromK: 112, toK: 120, stepK: 1 } })).warnings.some((w) => w.code === "below-boiling-point")).toBe(false);
    const bare = coldBox();
    bare.species["CH4(g)"] = speciesEntry("nasa7-2015", "CH4", "g");
    expect(evaluate(bare).warnings.some((w) => w.code === "below-boiling-point")).toBe(false);
  });

  it("takes a unit, and refuses what is not a temperature", () => {
    const req = coldBox();
    (req.species["CH4(g)"] as Record<string, unknown>).boilingPointK = "-161.49 degC";
    const w = evaluate(req).warnings.find((x) => x.code === "below-boiling-point")!;
    expect(w.boilingPointK).toBeCloseTo(111.66, 9);
    (req.species["CH4(g)"] as Record<string, unknown>).boilingPointK = "12 kJ/mol";
    expect(() => evaluate(req)).toThrow(EngineRefusal);
    expect(() => evaluate(req)).toThrow(/species\["CH4\(g\)"\]\.boilingPointK/);
  });

  it("also covers an unmarked key whose gas chain is in use below the boiling point", () => {
    const r = evaluate({
      reaction: "CH4 + 2 O2(g) -> CO2(g) + 2 H2O(g)",
      species: {
        CH4: { ...speciesEntry("nasa7-2015", "CH4", "g"), ...CH4 },
        "O2(g)": speciesEntry("nasa7-2015", "O2", "g"),
        "CO2(g)": speciesEntry("nasa7-2015", "CO2", "g"),
        "H2O(g)": { ...speciesEntry("nasa7-2015", "H2O", "g"), ...H2O },
      },
      temperatures: { listK: [100, 300, 400] },
    });
    const w = r.warnings.filter((x) => x.code === "below-boiling-point");
    expect(w.map((x) => [x.species, x.tK, x.toK])).toEqual([
      ["CH4", 100, 100],
      ["H2O(g)", 100, 300],
    ]);
  });
});

describe("condensed-phase-possible (equilibrium, screened by the normal boiling point)", () => {
  const shift = (pressureBar: number, feed: Record<string, number>) => ({
    reaction: "CO(g) + H2O(g) -> CO2(g) + H2(g)",
    species: {
      "CO(g)": speciesEntry("nasa7-2015", "CO", "g"),
      "H2O(g)": { ...speciesEntry("nasa7-2015", "H2O", "g"), ...H2O },
      "CO2(g)": speciesEntry("nasa7-2015", "CO2", "g"),
      "H2(g)": speciesEntry("nasa7-2015", "H2", "g"),
    },
    temperatures: { fromK: 300, toK: 400, stepK: 20 },
    equilibrium: { feed, pressureBar },
  });

  it("says water would condense below 373.12 K when its partial pressure is above 1 atm (30 bar, steam in excess)", () => {
    // Feed synthetic, invented for this test.
    const r = evaluate(shift(30, { "CO(g)": 1, "H2O(g)": 3 }));
    const w = r.warnings.filter((x) => x.code === "condensed-phase-possible");
    expect(w).toHaveLength(1);
    expect(w[0]).toMatchObject({ species: "H2O(g)", tK: 300, toK: 360, boilingPointK: 373.12, basis: "normal-boiling-point" });
    const y = r.equilibrium!.filter((p) => p.tK < 373.12).map((p) => p.moleFractions["H2O(g)"] * 30);
    expect(w[0].partialPressureBar).toBeCloseTo(Math.max(...y), 12);
    expect(w[0].message).toMatch(/^would condense from 300 K to 360 K: below its normal boiling point of 373.12 K/);
    expect(w[0].message).toMatch(/the equilibrium treats it as gas$/);
  });

  it("only may condense when the partial pressure is under 1 atm, and says it is a screen", () => {
    const r = evaluate(shift(1, { "CO(g)": 1, "H2O(g)": 1.2 }));
    const w = r.warnings.find((x) => x.code === "condensed-phase-possible")!;
    expect(w.partialPressureBar as number).toBeLessThan(1.01325);
    expect(w.message).toMatch(/^may condense .* \(below 1 atm its dew point is lower, so this is a screen, not a finding/);
  });

  it("is silent above the boiling point", () => {
    const r = evaluate({ ...shift(30, { "CO(g)": 1, "H2O(g)": 3 }), temperatures: { fromK: 380, toK: 500, stepK: 20 } });
    expect(r.warnings.some((x) => x.code === "condensed-phase-possible")).toBe(false);
  });

  it("does not flag a trace under 1e-6 bar partial pressure", () => {
    // Equilibrium points synthetic, invented for this test: H2O at 1e-7 and 1e-5 mole fraction, 1 bar.
    const species = { "H2O(g)": { segments: [], boilingPointK: 373.12 } } as unknown as Parameters<typeof condensationWarnings>[0];
    const info = { species: [{ key: "H2O(g)", role: "reacting" }], pressureBar: 1 } as unknown as Parameters<typeof condensationWarnings>[2];
    const pts = (y: number) => [{ tK: 300, moleFractions: { "H2O(g)": y } }] as unknown as Parameters<typeof condensationWarnings>[1];
    expect(condensationWarnings(species, pts(1e-7), info)).toEqual([]);
    expect(condensationWarnings(species, pts(1e-5), info)).toHaveLength(1);
  });
});
