/**
 * `include: ["contributions"]`: corrected − naive ΔrG split by species,
 *   Σ νᵢ[(Hᵢ(T) − Hᵢ(Tref)) − T(Sᵢ(T) − Sᵢ(Tref))] = −diffKJ,
 * checked against an independent closed-form evaluation of the published NASA-7 sets
 * (nasa7-2015: third-millennium database, 2015 update; ../shared/reference/cp-coefficients.json) and of the
 * Shomate fits to NIST-JANAF (Chase 1998), and the split of the 1σ band.
 * Bounds of 1e-6 and tighter compare two computations of one number (closed form, independent
 * solver, unit round trip): round-off allowances, common practice.
 */
import { describe, expect, it } from "vitest";
import { evaluate, R, type SegmentInput, type SpeciesInput } from "@/lib/thermo";
import { speciesEntry, type Family } from "./reference-data";

/** H (J/mol) and S (J/(mol·K)) of a species entry by its own published equations (not the engine). */
function closed(entry: SpeciesInput, T: number): { h: number; s: number } {
  const segs = entry.segments as SegmentInput[];
  // A boundary belongs to the lower range, as in the engine; outside, the end range carries on.
  const seg = segs.find((x) => T >= Number(x.tminK) && T <= Number(x.tmaxK)) ?? (T < Number(segs[0].tminK) ? segs[0] : segs[segs.length - 1]);
  const p = entry.standardPressurePa === 101325 ? R * Math.log(1.01325) : 0;
  if (seg.form === "nasa7") {
    const [a1, a2, a3, a4, a5, a6, a7] = seg.coeffs as number[];
    const h = R * T * (a1 + (a2 * T) / 2 + (a3 * T * T) / 3 + (a4 * T ** 3) / 4 + (a5 * T ** 4) / 5 + a6 / T);
    const s = R * (a1 * Math.log(T) + a2 * T + (a3 * T * T) / 2 + (a4 * T ** 3) / 3 + (a5 * T ** 4) / 4 + a7);
    return { h, s: s + p };
  }
  if (seg.form === "shomate") {
    const { A, B, C, D, E, F, G, H } = seg.coeffs as Record<string, number>;
    const t = T / 1000;
    const h = 1000 * (A * t + (B * t * t) / 2 + (C * t ** 3) / 3 + (D * t ** 4) / 4 - E / t + F - H) + 1000 * H;
    const s = A * Math.log(t) + B * t + (C * t * t) / 2 + (D * t ** 3) / 3 - E / (2 * t * t) + G;
    return { h, s };
  }
  throw new Error(`no closed form for ${seg.form}`);
}

type Spec = { key: string; family: Family; species: string; nu: number };

function request(reaction: string, specs: Spec[], extra: Record<string, unknown> = {}, uncertainty: Record<string, SpeciesInput["uncertainty"]> = {}) {
  const species = Object.fromEntries(specs.map((s) => [s.key, { ...speciesEntry(s.family, s.species, "g"), ...(uncertainty[s.key] ? { uncertainty: uncertainty[s.key] } : {}) }]));
  return { reaction, species, include: ["contributions"], ...extra };
}

/** Independent split: νᵢ[(Hᵢ(T) − Hᵢ(Tref)) − T(Sᵢ(T) − Sᵢ(Tref))] in kJ/mol from the closed forms. */
function independent(specs: Spec[], T: number, Tref = 298.15): Record<string, number> {
  return Object.fromEntries(
    specs.map((s) => {
      const e = speciesEntry(s.family, s.species, "g");
      const a = closed(e, T);
      const b = closed(e, Tref);
      return [s.key, (s.nu * (a.h - b.h - T * (a.s - b.s))) / 1000];
    }),
  );
}

// Steam reforming, CH4 + H2O → CO + 3 H2, on the third-millennium NASA-7 sets (2015 update).
const REFORMER: Spec[] = [
  { key: "CH4(g)", family: "nasa7-2015", species: "CH4", nu: -1 },
  { key: "H2O(g)", family: "nasa7-2015", species: "H2O", nu: -1 },
  { key: "CO(g)", family: "nasa7-2015", species: "CO", nu: 1 },
  { key: "H2(g)", family: "nasa7-2015", species: "H2", nu: 3 },
];
const REFORMING = "CH4(g) + H2O(g) -> CO(g) + 3 H2(g)";

describe("contributions: corrected − naive ΔrG split by species", () => {
  it("reformer on the NASA-7 2015 sets: each species as the closed form says, summing to −diffKJ within 1e-9 kJ/mol", () => {
    const r = evaluate(request(REFORMING, REFORMER, { temperatures: { fromK: 300, toK: 1500, stepK: 25 } }));
    expect(Object.keys(r.contributions!)).toEqual(REFORMER.map((s) => s.key));
    let worstSum = 0;
    let worstSpecies = 0;
    r.points.forEach((p, i) => {
      const own = independent(REFORMER, p.tK);
      let sum = 0;
      for (const s of REFORMER) {
        const c = r.contributions![s.key][i];
        sum += c;
        // Numeric integration vs the closed form: 1e-10 relative of the terms (README, fair tolerances).
        const scale = Math.abs(s.nu) * (1 + p.tK / 1000) * 1e3;
        worstSpecies = Math.max(worstSpecies, Math.abs(c - own[s.key]) / scale);
      }
      worstSum = Math.max(worstSum, Math.abs(sum + p.diffKJ));
    });
    expect(worstSum).toBeLessThanOrEqual(1e-9);
    expect(worstSpecies).toBeLessThanOrEqual(1e-10);
    expect(r.contributions!["H2(g)"]).toHaveLength(r.points.length);
  });

  it("the split is real physics: at 1100 K hydrogen (ν = 3) carries the largest share, and CH4 the opposite sign", () => {
    const r = evaluate(request(REFORMING, REFORMER, { temperatures: { listK: [298.15, 1100] } }));
    const c = (k: string) => r.contributions![k];
    // At Tref every share is zero: the two lines agree there.
    for (const s of REFORMER) expect(Math.abs(c(s.key)[0])).toBeLessThanOrEqual(1e-12);
    const own = independent(REFORMER, 1100);
    for (const s of REFORMER) expect(c(s.key)[1]).toBeCloseTo(own[s.key], 7);
    // −T·∫(Cp/T)dT + ∫Cp dT is negative for any positive Cp above Tref, so the sign follows −ν.
    expect(c("H2(g)")[1]).toBeLessThan(0);
    expect(c("CH4(g)")[1]).toBeGreaterThan(0);
  });

  it("shift converter on the Shomate fits to NIST-JANAF (Chase 1998): sum = −diffKJ and closed forms agree", () => {
    const specs: Spec[] = [
      { key: "CO(g)", family: "shomate-janaf", species: "CO", nu: -1 },
      { key: "H2O(g)", family: "shomate-janaf", species: "H2O", nu: -1 },
      { key: "CO2(g)", family: "shomate-janaf", species: "CO2", nu: 1 },
      { key: "H2(g)", family: "shomate-janaf", species: "H2", nu: 1 },
    ];
    const r = evaluate(request("CO(g) + H2O(g) -> CO2(g) + H2(g)", specs, { temperatures: { fromK: 500, toK: 1200, stepK: 50 } }));
    r.points.forEach((p, i) => {
      const own = independent(specs, p.tK);
      const sum = specs.reduce((a, s) => a + r.contributions![s.key][i], 0);
      expect(Math.abs(sum + p.diffKJ)).toBeLessThanOrEqual(1e-9);
      // 1e-10 relative (README) of terms up to ~1e3 kJ/mol, with room for the closed form's own round-off: 1e-7 kJ/mol.
      for (const s of specs) expect(Math.abs(r.contributions![s.key][i] - own[s.key])).toBeLessThanOrEqual(1e-7);
    });
  });

  it("holds across a phase change of an unmarked key (2015 water: ice, liquid, gas)", () => {
    const water: SpeciesInput = {
      segments: ["cr", "l", "g"].flatMap((ph) => speciesEntry("nasa7-2015", "H2O", ph).segments),
    };
    const r = evaluate({
      reaction: "H2(g) + 0.5 O2(g) -> H2O",
      species: { "H2(g)": speciesEntry("nasa7-2015", "H2", "g"), "O2(g)": speciesEntry("nasa7-2015", "O2", "g"), H2O: water },
      temperatures: { fromK: 250, toK: 500, stepK: 5 },
      include: ["contributions"],
    });
    expect(r.warnings.map((w) => w.code)).toContain("phase-change-in-span");
    r.points.forEach((p, i) => {
      const sum = r.contributions!.H2O[i] + r.contributions!["H2(g)"][i] + r.contributions!["O2(g)"][i];
      expect(Math.abs(sum + p.diffKJ)).toBeLessThanOrEqual(1e-9);
    });
  });

  it("is absent unless asked for", () => {
    const { include: _i, ...plain } = request(REFORMING, REFORMER, { temperatures: { listK: [1000] } });
    const r = evaluate(plain);
    expect(r.contributions).toBeUndefined();
    expect(r.contributionsSigma).toBeUndefined();
  });

  it("splits the 1σ band by variance share: (νᵢσᵢ)²/σ, ≥ 0, summing to sigmaDGkJ", () => {
    // Uncertainties synthetic, invented for this test.
    const U: Record<string, SpeciesInput["uncertainty"]> = {
      "CH4(g)": { dfHkJ: 0.3, sJ: 0.1, cpRelative: 0.01 },
      "CO(g)": { dfHkJ: 0.17, cpRelative: 0.005 },
      "H2(g)": { sJ: 0.02, cpRelative: 0.003 },
    };
    const r = evaluate(request(REFORMING, REFORMER, { temperatures: { fromK: 400, toK: 1400, stepK: 100 } }, U));
    const share = r.contributionsSigma!;
    expect(Object.keys(share)).toEqual(REFORMER.map((s) => s.key));
    r.points.forEach((p, i) => {
      // σᵢ of each species' G(T) from the closed forms, as lib/thermo/uncertainty.ts defines it.
      const sig = REFORMER.map((s) => {
        const u = U[s.key];
        if (!u) return 0;
        const e = speciesEntry(s.family, s.species, "g");
        const a = closed(e, p.tK);
        const b = closed(e, 298.15);
        const h = 1000 * ((u.dfHkJ as number) ?? 0);
        const t = p.tK * ((u.sJ as number) ?? 0);
        const c = (u.cpRelative ?? 0) * (a.h - b.h - p.tK * (a.s - b.s));
        return Math.abs(s.nu) * Math.sqrt(h * h + t * t + c * c);
      });
      const sigma = Math.sqrt(sig.reduce((a, x) => a + x * x, 0));
      expect(sigma / 1000).toBeCloseTo(p.sigmaDGkJ!, 9);
      let sum = 0;
      REFORMER.forEach((s, k) => {
        expect(share[s.key][i]).toBeGreaterThanOrEqual(0);
        expect(share[s.key][i]).toBeCloseTo((sig[k] * sig[k]) / sigma / 1000, 9);
        sum += share[s.key][i];
      });
      expect(Math.abs(sum - p.sigmaDGkJ!)).toBeLessThanOrEqual(1e-12);
    });
    // H2O carries no uncertainty: no share of the band.
    expect(share["H2O(g)"].every((x) => x === 0)).toBe(true);
  });
});
