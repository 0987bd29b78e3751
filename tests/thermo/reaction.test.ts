/**
 * Reaction properties: corrected vs naive, crossovers, sign cases, phases and warnings.
 * Bounds of 1e-6 and tighter compare two computations of one number (closed form, independent
 * solver, unit round trip): round-off allowances, common practice.
 */
import { describe, expect, it } from "vitest";
import { evaluate, speciesProperties, type SpeciesInput } from "@/lib/thermo";
import { janafRows, speciesEntry } from "./reference-data";

const shomate = (sp: string, phase = "g") => speciesEntry("shomate-janaf", sp, phase);
const nasa2015 = (sp: string, phase = "g") => speciesEntry("nasa7-2015", sp, phase);
const keysOf = (map: Record<string, SpeciesInput>) => map;

/**
 * Water with the common practice values Cp(cr) = 37.7, Cp(l) = 75.3 J/(mol·K) and
 * ΔfusH = 6.01 kJ/mol at 273.15 K. The anchor is liquid at 273.15 K, carried down from the
 * NIST-JANAF H-063 row at 298.15 K (ΔfH° −285.83 kJ/mol, S° 69.95 J/(mol·K)) with Cp(l) = 75.3.
 */
const water: SpeciesInput = {
  segments: [
    { phase: "cr", form: "constant", tminK: 200, tmaxK: 273.15, coeffs: { cpJ: 37.7 } },
    { phase: "l", form: "constant", tminK: 273.15, tmaxK: 373.15, coeffs: { cpJ: "75.3 J/(mol K)" } },
  ],
  transitions: [{ tK: "0 degC", from: "cr", to: "l", dHkJ: "6.01 kJ/mol" }],
  reference: { tK: 273.15, phase: "l", hkJ: -285.83 + (75.3 * (273.15 - 298.15)) / 1000, sJ: 69.95 + 75.3 * Math.log(273.15 / 298.15) },
};

const shift = {
  reaction: "CO(g) + H2O(g) -> CO2(g) + H2(g)",
  species: keysOf({ "CO(g)": shomate("CO"), "H2O(g)": shomate("H2O"), "CO2(g)": shomate("CO2"), "H2(g)": shomate("H2") }),
};

describe("supercooled water, liquid → ice at 263.15 K (README, common practice values)", () => {
  it("gives −213.1 J/mol corrected and −220.0 J/mol naive with the reference at 273.15 K", () => {
    const r = evaluate({
      reaction: "H2O(l) -> H2O(cr)",
      species: { "H2O(l)": water, "H2O(cr)": water },
      temperatures: { listK: [263.15] },
      referenceK: 273.15,
    });
    // README: −213.1 corrected, −220.0 naive; held to ±0.05 J/mol (half a unit in the value's last digit).
    expect(Math.abs(r.points[0].dGkJ * 1000 - -213.1)).toBeLessThanOrEqual(0.05);
    expect(Math.abs(r.points[0].naiveDGkJ * 1000 - -220.0)).toBeLessThanOrEqual(0.05);
    const codes = r.warnings.map((w) => `${w.code}:${w.species}`);
    expect(codes).toContain("extrapolation:H2O(l)");
    expect(codes).toContain("metastable-phase:H2O(l)");
    const ext = r.warnings.find((w) => w.code === "extrapolation")!;
    expect(ext.message).toBe("below the 273.15 K lower limit of the model by 10 K");
  });

  it("with 298.15 K as the reference the naive value differs and the ice chain is extrapolated to the reference", () => {
    const r = evaluate({ reaction: "H2O(l) -> H2O(cr)", species: { "H2O(l)": water, "H2O(cr)": water }, temperatures: { listK: [263.15] } });
    // Derived: the naive shortcut from 298.15 K uses ΔrH and ΔrS there, off the 273.15 K value by far more than its ±0.05.
    expect(Math.abs(r.points[0].naiveDGkJ * 1000 - -220.0)).toBeGreaterThan(0.5);
    expect(Math.abs(r.points[0].dGkJ * 1000 - -213.1)).toBeLessThanOrEqual(0.05);
    expect(r.warnings.some((w) => w.code === "reference-extrapolation" && w.species === "H2O(cr)")).toBe(true);
  });
});

describe("corrected and naive agree at the reference temperature (DESIGN.md: within 1e-9 kJ/mol)", () => {
  it.each([298.15, 700, 1250])("reference %s K", (referenceK) => {
    const r = evaluate({ ...shift, temperatures: { listK: [300, referenceK, 1300] }, referenceK });
    const at = r.points.find((p) => p.tK === referenceK)!;
    expect(Math.abs(at.dGkJ - at.naiveDGkJ)).toBeLessThanOrEqual(1e-9);
    expect(Math.abs(at.diffKJ)).toBeLessThanOrEqual(1e-9);
    expect(Math.abs(r.reference.dGkJ - at.dGkJ)).toBeLessThanOrEqual(1e-9);
  });
});

describe("sign cases of (ΔrH°, ΔrS°) at 298.15 K, Shomate fits to JANAF (Chase 1998)", () => {
  const sp = { "CH4(g)": shomate("CH4"), "O2(g)": shomate("O2"), "CO(g)": shomate("CO"), "H2(g)": shomate("H2"), "H2O(g)": shomate("H2O"), "CO2(g)": shomate("CO2") };
  const cases = [
    ["CH4(g) + 0.5 O2(g) -> CO(g) + 2 H2(g)", "favourable-always", "K > 1 at all T", true],
    ["CO(g) + H2O(g) -> CO2(g) + H2(g)", "favourable-below", "K > 1 only below the crossover temperature", false],
    ["CH4(g) + H2O(g) -> CO(g) + 3 H2(g)", "favourable-above", "K > 1 only above the crossover temperature", false],
    ["CO(g) + 2 H2(g) -> CH4(g) + 0.5 O2(g)", "favourable-never", "K > 1 at no T", true],
  ] as const;
  it.each(cases)("%s → %s", (reaction, code, text, agrees) => {
    const r = evaluate({ reaction, species: sp, temperatures: { fromK: 300, toK: 1300, stepK: 50 } });
    expect(r.signCase).toEqual({ code, text, correctedAgrees: agrees });
    const { dHkJ, dSJ } = r.reference;
    if (code === "favourable-always" || code === "favourable-never") expect(r.crossover.naiveK).toBeNull();
    else expect(r.crossover.naiveK).toBeCloseTo((dHkJ * 1000) / dSJ, 9);
  });
});

describe("crossover temperatures", () => {
  it("steam reforming: the corrected root is found to 1e-9 K and lies below the naive one", () => {
    const species = { "CH4(g)": shomate("CH4"), "H2O(g)": shomate("H2O"), "CO(g)": shomate("CO"), "H2(g)": shomate("H2") };
    const reaction = "CH4(g) + H2O(g) -> CO(g) + 3 H2(g)";
    const r = evaluate({ reaction, species, temperatures: { fromK: 600, toK: 1200, stepK: 100 } });
    expect(r.crossover.correctedK).toHaveLength(1);
    const root = r.crossover.correctedK[0];
    // Common practice: steam reforming turns favourable near 900 K at 1 bar (ΔrG° changes sign between 800 and 1000 K).
    expect(root).toBeGreaterThan(800);
    expect(root).toBeLessThan(r.crossover.naiveK!);
    const around = evaluate({ reaction, species, temperatures: { listK: [root - 1e-9, root + 1e-9] } });
    expect(around.points[0].dGkJ).toBeGreaterThan(0);
    expect(around.points[1].dGkJ).toBeLessThan(0);
  });

  it("finds two roots inside one grid step through the ΔrS = 0 extremum", () => {
    // Synthetic, invented for this test (not measurements): ΔrCp = 0.1·T,
    // ΔrS(500 K) = 0 and ΔrG(500 K) = +0.05 J/mol, so ΔrG = 0.05 − 0.05 (T − 500)² exactly.
    const a: SpeciesInput = { segments: [{ phase: "g", form: "constant", tminK: 300, tmaxK: 700, coeffs: { cpJ: 50 } }], reference: { tK: 500, phase: "g", hkJ: 0, sJ: 200 } };
    const b: SpeciesInput = {
      segments: [
        {
          phase: "g",
          form: "power",
          tminK: 300,
          tmaxK: 700,
          coeffs: {
            terms: [
              { k: 0, c: 50 },
              { k: 1, c: 0.1 },
            ],
          },
        },
      ],
      reference: { tK: 500, phase: "g", hkJ: 0.05e-3, sJ: 200 },
    };
    const r = evaluate({ reaction: "C2H5OH(g) -> CH3OCH3(g)", species: { "C2H5OH(g)": a, "CH3OCH3(g)": b }, temperatures: { fromK: 400, toK: 603, stepK: 7 } });
    expect(r.points.every((p) => p.dGkJ < 0)).toBe(true);
    expect(r.crossover.correctedK).toHaveLength(2);
    expect(Math.abs(r.crossover.correctedK[0] - 499)).toBeLessThanOrEqual(1e-9);
    expect(Math.abs(r.crossover.correctedK[1] - 501)).toBeLessThanOrEqual(1e-9);
  });
});

describe("a phase transition crossed inside the span", () => {
  it("H2 + ½ O2 → H2O (no phase marker) switches ice → liquid at 273.15 K", () => {
    const r = evaluate({
      reaction: "H2(g) + 0.5 O2(g) -> H2O",
      species: { "H2(g)": nasa2015("H2"), "O2(g)": nasa2015("O2"), H2O: water },
      temperatures: { fromK: 260, toK: 290, stepK: 1 },
      include: ["species"],
    });
    const w = r.warnings.find((x) => x.code === "phase-change-in-span")!;
    expect(w).toBeDefined();
    expect(w.species).toBe("H2O");
    expect(w.from).toBe("cr");
    expect(w.to).toBe("l");
    expect(Math.abs(w.tK! - 273.15)).toBeLessThanOrEqual(1e-6);
    expect(w.dHkJ as number).toBeCloseTo(6.01, 9);
    const rows = r.species!.H2O;
    expect(rows.find((x) => x.tK === 273)!.phase).toBe("cr");
    expect(rows.find((x) => x.tK === 274)!.phase).toBe("l");
    const p273 = r.points.find((p) => p.tK === 273)!;
    const p274 = r.points.find((p) => p.tK === 274)!;
    // ΔrH jumps up by ΔfusH (the product melts; plus ~1 K of ΔrCp), ΔrG stays continuous.
    expect(p274.dHkJ - p273.dHkJ).toBeGreaterThan(5.9);
    const p272 = r.points.find((p) => p.tK === 272)!;
    // No step in ΔrG: the change over the step that holds 273.15 K is like the one before (slope −ΔrS ≈ 0.16 kJ/K).
    expect(Math.abs(p274.dGkJ - p273.dGkJ - (p273.dGkJ - p272.dGkJ))).toBeLessThan(0.03);
  });
});

describe("warnings", () => {
  it("extrapolation and reference-extrapolation name the species, side and kelvin (EVALUATE.md wording)", () => {
    const r = evaluate({ ...shift, temperatures: { fromK: 300, toK: 1500, stepK: 100 } });
    const ext = r.warnings.find((w) => w.code === "extrapolation")!;
    expect(ext).toMatchObject({ species: "H2O(g)", tK: 300, side: "below", byK: 200, message: "below the 500 K lower limit of the model by 200 K" });
    expect(r.warnings.find((w) => w.code === "reference-extrapolation")).toMatchObject({ species: "H2O(g)", tK: 298.15 });
  });

  it("segment-jump gives the size at a shared edge inside the span only", () => {
    const inside = evaluate({ ...shift, temperatures: { fromK: 1000, toK: 1400, stepK: 50 }, referenceK: 1000 });
    const jump = inside.warnings.find((w) => w.code === "segment-jump" && w.species === "CO2(g)")!;
    expect(jump.tK).toBe(1200);
    // Derived: the jump must be visible above the 1e-9 floor of a continuous chain; 1 J/mol is far above it.
    expect(Math.abs(jump.dHkJ as number)).toBeGreaterThan(1e-3);
    const outside = evaluate({ ...shift, temperatures: { fromK: 600, toK: 1000, stepK: 50 }, referenceK: 700 });
    expect(outside.warnings.some((w) => w.code === "segment-jump" && w.species === "CO2(g)")).toBe(false);
  });

  it("transition-mismatch: a stated transition is checked against the G crossing of two phases with constants", () => {
    // NASA-7 ice and liquid water (third-millennium database, 2015 update; nasa7-2015); ΔfusH 6.01 kJ/mol at 273.15 K (common practice)
    const segments = [...nasa2015("H2O", "cr").segments, ...nasa2015("H2O", "l").segments];
    const ok = speciesProperties({ segments, transitions: [{ tK: 273.15, from: "cr", to: "l", dHkJ: 6.01 }] }, [250, 300]);
    expect(ok.warnings.some((w) => w.code === "transition-mismatch")).toBe(false);
    const off = speciesProperties({ segments, transitions: [{ tK: 280, from: "cr", to: "l", dHkJ: 6.01 }] }, [250, 300]);
    const w = off.warnings.find((x) => x.code === "transition-mismatch")!;
    expect(w).toBeDefined();
    expect(Math.abs((w.derivedK as number) - 273.15)).toBeLessThan(0.1);
  });

  it("reference-mismatch when a stated reference disagrees with a set's own constants", () => {
    // NIST-JANAF Tables, 4th ed. (Chase 1998), H2O(g), table H-064, 298.15 K: ΔfH° and S°
    const row = janafRows().find((r) => r.species === "H2O" && r.phase === "g" && r.T === 298.15)!;
    expect(row.janafTable).toBe("H-064");
    const agree = speciesProperties({ ...nasa2015("H2O"), reference: { tK: 298.15, phase: "g", hkJ: row.dfH!, sJ: row.S } }, [500]);
    expect(agree.warnings.some((w) => w.code === "reference-mismatch")).toBe(false);
    // The same anchor with S° 1 J/(mol·K) too high (synthetic, invented for this test).
    const off = speciesProperties({ ...nasa2015("H2O"), reference: { tK: 298.15, phase: "g", hkJ: row.dfH!, sJ: row.S + 1 } }, [500]);
    expect(off.warnings.find((w) => w.code === "reference-mismatch")).toMatchObject({ species: "species", tK: 298.15 });
  });

  it("nonphysical-cp where a model's Cp is not positive", () => {
    // Synthetic, invented for this test: Cp = 30 − 0.1 T crosses zero at 300 K.
    const made: SpeciesInput = {
      segments: [{ phase: "g", form: "expression", tminK: 200, tmaxK: 400, coeffs: { cp: "30 - 0.1*T" } }],
      reference: { tK: 250, phase: "g", hkJ: 0, sJ: 100 },
    };
    const out = speciesProperties(made, [250, 290, 310, 350]);
    expect(out.warnings.find((w) => w.code === "nonphysical-cp")).toMatchObject({ tK: 310 });
  });

  it("high-pressure above 10 bar (pressureBar, with units)", () => {
    const base = { ...shift, temperatures: { listK: [700] } };
    expect(evaluate({ ...base, pressureBar: 30 }).warnings.some((w) => w.code === "high-pressure")).toBe(true);
    expect(evaluate({ ...base, pressureBar: "3 MPa" }).warnings.find((w) => w.code === "high-pressure")!.pressureBar).toBeCloseTo(30, 12);
    expect(evaluate({ ...base, pressureBar: 5 }).warnings.some((w) => w.code === "high-pressure")).toBe(false);
  });
});

describe("result shape", () => {
  it("points carry the contract fields; species rows only with include: ['species']", () => {
    const plain = evaluate({ ...shift, temperatures: { fromK: 500, toK: 700, stepK: 100 }, toleranceKJ: 1, toleranceKFactor: 2 });
    expect(plain.species).toBeUndefined();
    expect(Object.keys(plain)).toEqual(["points", "reference", "crossover", "signCase", "warnings", "engine"]);
    for (const key of ["tK", "dCpJ", "dHkJ", "dSJ", "dGkJ", "lnK", "log10K", "K", "naiveDGkJ", "naiveLnK", "diffKJ", "exceedsTolerance"]) {
      expect(plain.points[0]).toHaveProperty(key);
    }
    for (const p of plain.points) {
      expect(p.diffKJ).toBeCloseTo(p.naiveDGkJ - p.dGkJ, 12);
      expect(p.K).toBeCloseTo(Math.exp(p.lnK), 9);
      expect(p.exceedsTolerance).toBe(Math.abs(p.diffKJ) > 1 || Math.abs(p.naiveLnK - p.lnK) > Math.log(2));
    }
    const full = evaluate({ ...shift, temperatures: { fromK: 500, toK: 700, stepK: 100 }, include: ["species"] });
    expect(Object.keys(full.species!)).toEqual(["CO(g)", "H2O(g)", "CO2(g)", "H2(g)"]);
    const row = full.species!["CO(g)"][0];
    expect(row.gkJ).toBe(row.hkJ - (row.tK * row.sJ) / 1000);
    expect(full.engine.version).toMatch(/^\d+\.\d+\.\d+$/);
  });

  it("temperature grids accept units; a step in degF is a difference", () => {
    const r = evaluate({ ...shift, temperatures: { fromK: "500 degF", toK: "536 degF", stepK: "18 degF" } });
    expect(r.points.map((p) => p.tK)).toHaveLength(3);
    expect(r.points[0].tK).toBeCloseTo(533.15, 9);
    expect(r.points[1].tK - r.points[0].tK).toBeCloseTo(10, 9);
  });
});
