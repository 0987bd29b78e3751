/**
 * Uncertainty bands (linear propagation) against a seeded Monte Carlo of the same species
 * data, and the source comparison helper.
 */
import { describe, expect, it } from "vitest";
import { compareSources, evaluate, type EvaluateRequest, type SegmentInput, type SpeciesInput } from "@/lib/thermo";
import { speciesEntry, type Family } from "./reference-data";
import { seededNormals } from "../helpers/random";

const SHIFT = "CO(g) + H2O(g) -> CO2(g) + H2(g)";
const REFORM = "CH4(g) + H2O(g) -> CO(g) + 3 H2(g)";

// Standard uncertainties of ΔfH° (kJ/mol) and S° (J/(mol·K)): CODATA Key Values for
// Thermodynamics (Cox, Wagman, Medvedev 1989) (from memory). Cp: 1 % (from memory: the usual
// order of a fitted Cp correlation's uncertainty in this range).
const U: Record<string, { dfHkJ: number; sJ: number; cpRelative: number }> = {
  CO: { dfHkJ: 0.17, sJ: 0.004, cpRelative: 0.01 },
  H2O: { dfHkJ: 0.04, sJ: 0.01, cpRelative: 0.01 },
  CO2: { dfHkJ: 0.13, sJ: 0.01, cpRelative: 0.01 },
  H2: { dfHkJ: 0, sJ: 0.003, cpRelative: 0.01 },
};

const normals = seededNormals;

/**
 * The first Shomate segment with ΔfH° shifted by dh (kJ/mol), S° by ds (J/(mol·K)) and Cp
 * scaled by 1 + e from 298.15 K: A..E scale, F and G absorb the shift so that H and S at
 * 298.15 K move by exactly dh and ds (Shomate equations, NIST Chemistry WebBook convention).
 */
function perturbed(entry: SpeciesInput, dh: number, ds: number, e: number): SpeciesInput {
  const [first, ...rest] = entry.segments;
  if (first.form !== "shomate") throw new Error("expected a Shomate segment");
  const c = first.coeffs;
  const t = 0.29815;
  const P = c.A * t + (c.B * t ** 2) / 2 + (c.C * t ** 3) / 3 + (c.D * t ** 4) / 4 - c.E / t;
  const Q = c.A * Math.log(t) + c.B * t + (c.C * t ** 2) / 2 + (c.D * t ** 3) / 3 - c.E / (2 * t ** 2);
  const k = 1 + e;
  const seg: SegmentInput = {
    ...first,
    coeffs: { A: c.A * k, B: c.B * k, C: c.C * k, D: c.D * k, E: c.E * k, F: c.F + dh - e * P, G: c.G + ds - e * Q, H: c.H + dh },
  };
  return { ...entry, segments: [seg, ...rest] };
}

const base = (name: string) => speciesEntry("shomate-janaf", name, "g");
const request = (species: Record<string, SpeciesInput>): EvaluateRequest => ({
  reaction: SHIFT,
  species,
  // Within the first Shomate range of every species, where the perturbation above is exact.
  temperatures: { listK: [600, 900] },
  equilibrium: { feed: { "CO(g)": 1, "H2O(g)": 2.5, "H2(g)": 0.2 }, pressureBar: 20, key: "CO(g)" },
});

describe("linear uncertainty vs a seeded Monte Carlo", () => {
  const names = ["CO", "H2O", "CO2", "H2"];
  const withU = Object.fromEntries(names.map((n) => [`${n}(g)`, { ...base(n), uncertainty: U[n] }]));
  const linear = evaluate(request(withU));

  const N = 3000;
  const draw = normals(20261201);
  const samples: { dG: number[]; lk: number[]; nDG: number[]; x: number[]; nx: number[]; h2: number[] }[] = [];
  for (let s = 0; s < N; s++) {
    const species = Object.fromEntries(names.map((n) => [`${n}(g)`, perturbed(base(n), U[n].dfHkJ * draw(), U[n].sJ * draw(), U[n].cpRelative * draw())]));
    const r = evaluate(request(species));
    samples.push({
      dG: r.points.map((p) => p.dGkJ),
      lk: r.points.map((p) => p.log10K),
      nDG: r.points.map((p) => p.naiveDGkJ),
      x: r.equilibrium!.map((p) => p.keyFraction!),
      nx: r.equilibrium!.map((p) => p.naive.keyFraction!),
      h2: r.equilibrium!.map((p) => p.moleFractions["H2(g)"]),
    });
  }
  const sd = (pick: (s: (typeof samples)[number]) => number) => {
    const v = samples.map(pick);
    const m = v.reduce((a, b) => a + b, 0) / v.length;
    return Math.sqrt(v.reduce((a, b) => a + (b - m) ** 2, 0) / (v.length - 1));
  };
  // 3000 draws estimate a standard deviation to ≈1.3 % (1/√(2N)); 5 % is about four of those.
  const TOL = 0.05;
  it.each([0, 1])("grid point %i: σ of ΔrG, log10 K, the naive ΔrG and the outlet fractions", (i) => {
    const p = linear.points[i];
    const e = linear.equilibrium![i];
    expect(Math.abs(p.sigmaDGkJ! / sd((s) => s.dG[i]) - 1)).toBeLessThan(TOL);
    expect(Math.abs(p.sigmaLog10K! / sd((s) => s.lk[i]) - 1)).toBeLessThan(TOL);
    expect(Math.abs(p.naiveSigmaDGkJ! / sd((s) => s.nDG[i]) - 1)).toBeLessThan(TOL);
    expect(Math.abs(e.sigma!.keyFraction! / sd((s) => s.x[i]) - 1)).toBeLessThan(TOL);
    expect(Math.abs(e.naive.sigma!.keyFraction! / sd((s) => s.nx[i]) - 1)).toBeLessThan(TOL);
    expect(Math.abs(e.sigma!.moleFractions["H2(g)"] / sd((s) => s.h2[i]) - 1)).toBeLessThan(TOL);
    expect(e.sigma!.log10K[0]).toBeCloseTo(p.sigmaLog10K!, 14);
  });
  it("says where the naive error exceeds the data's own uncertainty", () => {
    const over = linear.points.filter((p) => Math.abs(p.diffKJ) > p.sigmaDGkJ!).map((p) => p.tK);
    expect(linear.uncertainty!.naiveExceedsK).toEqual(over);
    expect(linear.points.map((p) => p.naiveExceedsUncertainty)).toEqual(linear.points.map((p) => over.includes(p.tK)));
    expect(linear.equilibriumInfo!.naiveExceedsUncertaintyK).toEqual(linear.equilibrium!.filter((p) => Math.abs(p.keyFractionDiff) > p.sigma!.keyFraction!).map((p) => p.tK));
    // 900 K is 600 K from the reference: the naive shortcut is off by more than the data's 1σ (docs/engine.md).
    expect(linear.uncertainty!.naiveExceedsK).toContain(900);
    expect(linear.uncertainty!.species["CO(g)"]).toEqual(U.CO);
  });
  it("adds no sigma fields when no species carries an uncertainty", () => {
    const plain = evaluate(request(Object.fromEntries(names.map((n) => [`${n}(g)`, base(n)]))));
    expect(plain.uncertainty).toBeUndefined();
    expect(plain.points[0]).not.toHaveProperty("sigmaDGkJ");
    expect(plain.equilibrium![0]).not.toHaveProperty("sigma");
  });
});

describe("sources side by side", () => {
  const names = ["CH4", "H2O", "CO", "CO2", "H2"];
  const setOf = (family: Family) => Object.fromEntries(names.map((n) => [`${n}(g)`, speciesEntry(family, n, "g")]));
  const req: EvaluateRequest = {
    reaction: SHIFT,
    species: setOf("shomate-janaf"),
    temperatures: { listK: [900, 1000, 1100] },
    equilibrium: { feed: { "CH4(g)": 1, "H2O(g)": 3 }, pressureBar: 25, reactions: [REFORM, SHIFT], key: "CH4(g)" },
  };
  const families: Family[] = ["shomate-janaf", "nasa7-2015", "nasa7-gri30"];
  const cmp = compareSources(
    req,
    families.map((f) => ({ label: f, species: setOf(f) })),
  );
  it("each variant is the plain evaluation with that family's species", () => {
    cmp.variants.forEach((v, k) => {
      expect(v.result).toEqual(evaluate({ ...req, species: setOf(families[k]) }));
    });
  });
  it("the spread is max − min across the variants", () => {
    cmp.spread.forEach((row, i) => {
      const lk = cmp.variants.map((v) => v.result.points[i].log10K);
      expect(row.log10K.min).toBe(Math.min(...lk));
      expect(row.log10K.max).toBe(Math.max(...lk));
      expect(row.log10K.range).toBeCloseTo(Math.max(...lk) - Math.min(...lk), 15);
      const x = cmp.variants.map((v) => v.result.equilibrium![i].keyFraction!);
      expect(row.keyFraction!.range).toBeCloseTo(Math.max(...x) - Math.min(...x), 15);
      expect(row.moleFractions!["H2(g)"].max).toBe(Math.max(...cmp.variants.map((v) => v.result.equilibrium![i].moleFractions["H2(g)"])));
      // Every family reproduces JANAF's shift log10 K within 0.05 (shared/reference README), so two differ by at most 0.1.
      expect(row.log10K.range).toBeLessThan(0.1);
      expect(row.log10K.range).toBeGreaterThan(0);
    });
  });
  it("refuses a single variant", () => {
    expect(() => compareSources(req, [{ label: "only", species: setOf("shomate-janaf") }])).toThrow("compareSources: give at least two variants to compare");
  });
});
