/**
 * Real gas at pressure: Peng–Robinson compressibility factors against published fluid data,
 * mixture fugacity coefficients against an independent route written here (numerical
 * derivatives of the residual Helmholtz energy), the ammonia-synthesis equilibrium against
 * the published high-pressure measurements, the self-consistency of φ with the composition,
 * and the refusals.
 * Bounds of 1e-6 and tighter compare two computations of one number (closed form, independent
 * solver, unit round trip): round-off allowances, common practice.
 */
import { describe, expect, it } from "vitest";
import { evaluate, EngineRefusal, parseFormula, type EvaluateRequest, type SpeciesInput } from "@/lib/thermo";
import { prMixture, prZPure, type CriticalConstants } from "@/lib/thermo/eos";
import { CRITICAL_CONSTANTS as C } from "@/seeders/critical-constants";
import { speciesEntry } from "./reference-data";

const R = 8.314462618;
/** Shomate sets (fits to NIST-JANAF, Chase 1998) from ../shared/reference/cp-coefficients.json, with the seeded critical constants. */
const gas = (n: string): SpeciesInput => ({ ...speciesEntry("shomate-janaf", n, "g"), critical: C[n] });
const AMMONIA = "N2(g) + 3 H2(g) -> 2 NH3(g)";
const ammoniaSpecies = () => ({ "N2(g)": gas("N2"), "H2(g)": gas("H2"), "NH3(g)": gas("NH3") });

function refusal(req: unknown): EngineRefusal {
  try {
    evaluate(req);
  } catch (e) {
    if (e instanceof EngineRefusal) return e;
    throw e;
  }
  throw new Error("expected a refusal");
}

describe("Peng–Robinson compressibility factor of pure gases", () => {
  // NIST Chemistry WebBook, Thermophysical Properties of Fluid Systems (reference equations of
  // state: Span et al. for N2, Setzmann & Wagner for CH4, Span & Wagner for CO2), values
  // recalled (from memory), rounded. PR with its generalised constants is a few per cent off
  // in gas densities (common practice), so 0.03 in Z; the 1 bar CO2 point, where Z − 1 is the
  // second virial coefficient (B(300 K) ≈ −122 cm³/mol, from memory), is held to 0.002.
  // A search of public pages (2026-12-04) found no table of these Z values to cite (the WebBook's
  // fluid pages compute them on request and are not looked up), so the rows stay recalled.
  const rows: { species: string; tK: number; pBar: number; z: number; tol: number }[] = [
    { species: "N2", tK: 300, pBar: 100, z: 1.004, tol: 0.03 },
    { species: "N2", tK: 300, pBar: 200, z: 1.037, tol: 0.03 },
    { species: "CH4", tK: 300, pBar: 50, z: 0.92, tol: 0.03 },
    { species: "CH4", tK: 300, pBar: 100, z: 0.855, tol: 0.03 },
    { species: "CO2", tK: 300, pBar: 1, z: 0.995, tol: 0.002 },
    { species: "CO2", tK: 400, pBar: 100, z: 0.82, tol: 0.03 },
  ];
  for (const r of rows) {
    it(`${r.species} at ${r.tK} K and ${r.pBar} bar: Z ≈ ${r.z} (NIST WebBook, from memory)`, () => {
      expect(Math.abs(prZPure(C[r.species], r.tK, r.pBar) - r.z)).toBeLessThanOrEqual(r.tol);
    });
  }

  it("Z → 1 as p → 0, and liquid CO2 at 280 K and 100 bar takes the dense root", () => {
    for (const s of ["N2", "CH4", "CO2", "NH3", "H2O", "H2"]) expect(Math.abs(prZPure(C[s], 700, 1e-6) - 1)).toBeLessThan(1e-8);
    // Liquid CO2 near 280 K, 100 bar has a density near 930 kg/m³ (NIST WebBook, from memory): Z ≈ 0.24.
    const z = prZPure(C.CO2, 280, 100);
    expect(z).toBeGreaterThan(0.18);
    expect(z).toBeLessThan(0.3);
  });
});

describe("mixture fugacity coefficients against an independent route", () => {
  /**
   * Written here from the published equation (Peng & Robinson 1976): the residual Helmholtz
   * energy of n moles in volume V,
   *   A_res/RT = −n ln(1 − B/V) − D/(2√2 B RT) ln[(V + (1+√2)B)/(V + (1−√2)B)],
   *   B = Σ n_i b_i, D = ΣΣ n_i n_j (1 − k_ij) √(a_i a_j),
   * V from the pressure equation by bisection, and ln φ_i = ∂(A_res/RT)/∂n_i|T,V − ln Z by
   * central differences. No code is shared with lib/thermo/eos.ts but R.
   */
  function independentLnPhi(tK: number, pBar: number, y: number[], crit: CriticalConstants[], kij: number[][]): { z: number; lnPhi: number[] } {
    const P = pBar * 1e5;
    const RT = R * tK;
    const ab = crit.map((c) => {
      const kappa = 0.37464 + 1.54226 * c.omega - 0.26992 * c.omega ** 2;
      const alpha = (1 + kappa * (1 - Math.sqrt(tK / c.tcK))) ** 2;
      return { a: (0.45724 * R * R * c.tcK * c.tcK * alpha) / (c.pcBar * 1e5), b: (0.0778 * R * c.tcK) / (c.pcBar * 1e5) };
    });
    const BD = (n: number[]) => {
      let B = 0;
      let D = 0;
      n.forEach((ni, i) => {
        B += ni * ab[i].b;
        n.forEach((nj, j) => (D += ni * nj * (1 - kij[i][j]) * Math.sqrt(ab[i].a * ab[j].a)));
      });
      return { B, D };
    };
    const pressure = (V: number, n: number[]) => {
      const { B, D } = BD(n);
      const N = n.reduce((a, b) => a + b, 0);
      return (N * RT) / (V - B) - D / (V * V + 2 * V * B - B * B);
    };
    const aRes = (V: number, n: number[]) => {
      const { B, D } = BD(n);
      const N = n.reduce((a, b) => a + b, 0);
      return -N * Math.log(1 - B / V) - (D / (2 * Math.SQRT2 * B * RT)) * Math.log((V + (1 + Math.SQRT2) * B) / (V + (1 - Math.SQRT2) * B));
    };
    // One mole; supercritical mixture, so p(V) is monotone and bisection finds the one root.
    const { B } = BD(y);
    let lo = B * (1 + 1e-9);
    let hi = (100 * RT) / P;
    for (let i = 0; i < 300; i++) {
      const mid = Math.sqrt(lo * hi);
      if (pressure(mid, y) > P) lo = mid;
      else hi = mid;
    }
    const V = Math.sqrt(lo * hi);
    const z = (P * V) / RT;
    const lnPhi = y.map((_, i) => {
      const h = 1e-6;
      const up = y.map((v, j) => (j === i ? v + h : v));
      const dn = y.map((v, j) => (j === i ? v - h : v));
      return (aRes(V, up) - aRes(V, dn)) / (2 * h) - Math.log(z);
    });
    return { z, lnPhi };
  }

  const cases = [
    // Compositions and kij values synthetic, invented for this test.
    { name: "ammonia loop gas at 700 K, 300 bar", tK: 700, pBar: 300, species: ["N2", "H2", "NH3", "CH4"], y: [0.2, 0.6, 0.15, 0.05], k: [[0, 3, 0.03]] },
    {
      name: "shift gas at 500 K, 30 bar",
      tK: 500,
      pBar: 30,
      species: ["CO", "H2O", "CO2", "H2", "CH4"],
      y: [0.03, 0.35, 0.12, 0.47, 0.03],
      k: [
        [1, 2, 0.12],
        [2, 4, 0.09],
      ],
    },
    { name: "CO2-rich gas at 320 K, 80 bar", tK: 320, pBar: 80, species: ["CO2", "CH4", "N2"], y: [0.5, 0.4, 0.1], k: [] as number[][] },
  ];
  for (const c of cases) {
    it(`${c.name}: Z and ln φ agree to 1e-7`, () => {
      const crit = c.species.map((s) => C[s]);
      const kij = c.species.map(() => c.species.map(() => 0));
      for (const [i, j, v] of c.k) kij[i][j] = kij[j][i] = v;
      const ours = prMixture(c.tK, c.pBar, c.y, crit, kij);
      const theirs = independentLnPhi(c.tK, c.pBar, c.y, crit, kij);
      expect(Math.abs(ours.z - theirs.z)).toBeLessThan(1e-9);
      ours.lnPhi.forEach((v, i) => expect(Math.abs(v - theirs.lnPhi[i]), c.species[i]).toBeLessThan(1e-7));
    });
  }
});

describe("ammonia synthesis at high pressure against Larson & Dodge (1923)", () => {
  // A. T. Larson and R. L. Dodge, "The ammonia equilibrium", J. Am. Chem. Soc. 45 (1923) 2918,
  // with Larson, J. Am. Chem. Soc. 46 (1924) 367 for 600 and 1000 atm: mole per cent NH3 at
  // equilibrium from a 3:1 H2:N2 feed. Values recalled (from memory), as they are reproduced in
  // textbook tables. K from the Shomate sets (NIST-JANAF fits); PR with kij = 0. A search of
  // public pages (2026-12-04) found only the paper's abstract-level citations and rounded school
  // tables, no reproduction of the measured table to cite, so the rows stay recalled.
  const measured: { c: number; atm: number; nh3: number }[] = [
    { c: 400, atm: 10, nh3: 3.85 },
    { c: 400, atm: 30, nh3: 10.09 },
    { c: 400, atm: 50, nh3: 15.27 },
    { c: 400, atm: 100, nh3: 25.12 },
    { c: 400, atm: 300, nh3: 47.0 },
    { c: 400, atm: 600, nh3: 65.2 },
    { c: 400, atm: 1000, nh3: 79.82 },
    { c: 450, atm: 10, nh3: 2.04 },
    { c: 450, atm: 30, nh3: 5.8 },
    { c: 450, atm: 50, nh3: 9.17 },
    { c: 450, atm: 100, nh3: 16.36 },
    { c: 450, atm: 300, nh3: 35.5 },
    { c: 450, atm: 600, nh3: 53.6 },
    { c: 450, atm: 1000, nh3: 69.4 },
    { c: 500, atm: 10, nh3: 1.2 },
    { c: 500, atm: 30, nh3: 3.5 },
    { c: 500, atm: 50, nh3: 5.58 },
    { c: 500, atm: 100, nh3: 10.61 },
    { c: 500, atm: 300, nh3: 26.44 },
    { c: 500, atm: 600, nh3: 42.15 },
    { c: 500, atm: 1000, nh3: 57.47 },
  ];
  const solve = (atm: number) =>
    evaluate({
      reaction: AMMONIA,
      species: ammoniaSpecies(),
      temperatures: { listK: [673.15, 723.15, 773.15] },
      equilibrium: { feed: { "N2(g)": 1, "H2(g)": 3 }, pressureBar: `${atm} atm`, gas: "peng-robinson" },
    }).equilibrium!;
  const byAtm = new Map([10, 30, 50, 100, 300, 600, 1000].map((a) => [a, solve(a)]));
  const at = (c: number, atm: number) => byAtm.get(atm)!.find((p) => Math.abs(p.tK - (c + 273.15)) < 1e-9)!;

  it("10–300 atm: Peng–Robinson within 1.2 mol-% NH3 of the measurements", () => {
    for (const m of measured.filter((r) => r.atm <= 300)) {
      const pr = 100 * at(m.c, m.atm).moleFractions["NH3(g)"];
      expect(Math.abs(pr - m.nh3), `${m.c} °C, ${m.atm} atm: ${pr.toFixed(2)} vs ${m.nh3}`).toBeLessThanOrEqual(1.2);
    }
  });

  it("at 300 atm and above the ideal-gas answer is 3–17 points low and Peng–Robinson is always closer", () => {
    for (const m of measured.filter((r) => r.atm >= 300)) {
      const p = at(m.c, m.atm);
      const pr = 100 * p.moleFractions["NH3(g)"];
      const ideal = 100 * p.ideal!.moleFractions["NH3(g)"];
      expect(m.nh3 - ideal, `${m.c} °C, ${m.atm} atm ideal ${ideal.toFixed(2)}`).toBeGreaterThan(2.5);
      expect(Math.abs(pr - m.nh3)).toBeLessThan(Math.abs(ideal - m.nh3));
    }
  });

  it("600 atm within 3 points; 1000 atm within 6 (PR with kij = 0 runs low there, stated in docs/equilibrium.md)", () => {
    for (const m of measured.filter((r) => r.atm >= 600)) {
      const pr = 100 * at(m.c, m.atm).moleFractions["NH3(g)"];
      expect(Math.abs(pr - m.nh3), `${m.c} °C, ${m.atm} atm: ${pr.toFixed(2)}`).toBeLessThanOrEqual(m.atm === 600 ? 3 : 6);
    }
  });

  it("the solution satisfies K = Π (φ_i y_i p/p°)^ν_i with the reported φ, and the element balance", () => {
    const R300 = evaluate({
      reaction: AMMONIA,
      species: ammoniaSpecies(),
      temperatures: { listK: [700, 800] },
      equilibrium: { feed: { "N2(g)": 1, "H2(g)": 3, "NH3(g)": 0.04 }, pressureBar: 300, gas: "peng-robinson" },
    });
    const nu: Record<string, number> = { "N2(g)": -1, "H2(g)": -3, "NH3(g)": 2 };
    for (const p of R300.equilibrium!) {
      for (const sol of [p, p.naive]) {
        const lnQ = Object.entries(nu).reduce((a, [k, v]) => a + v * Math.log(sol.fugacityCoefficients[k] * sol.moleFractions[k] * 300), 0);
        expect(Math.abs(lnQ - sol.log10K[0] * Math.LN10)).toBeLessThan(1e-8);
        // φ is the one of the outlet composition, recomputed here.
        const y = ["N2(g)", "H2(g)", "NH3(g)"].map((k) => sol.moleFractions[k]);
        const lnPhi = prMixture(p.tK, 300, y, [C.N2, C.H2, C.NH3]).lnPhi;
        ["N2(g)", "H2(g)", "NH3(g)"].forEach((k, i) => expect(Math.abs(Math.log(sol.fugacityCoefficients[k]) - lnPhi[i])).toBeLessThan(1e-9));
        expect(sol.diagnostics.realGas!.converged).toBe(true);
      }
      const n = 3 * 0 + 1 * 2 + 0.04; // N atoms in the feed
      const nN = 2 * p.moles["N2(g)"] + p.moles["NH3(g)"];
      expect(Math.abs(nN - n)).toBeLessThan(1e-12);
      expect(p.ideal!.keyConversion).toBeLessThan(p.keyConversion);
    }
    expect(R300.equilibriumInfo!.gas).toBe("peng-robinson");
  });
});

describe("gas model selection", () => {
  const base = (eq: Record<string, unknown>, species: Record<string, SpeciesInput> = ammoniaSpecies()): EvaluateRequest => ({
    reaction: AMMONIA,
    species,
    temperatures: { listK: [700] },
    equilibrium: { feed: { "N2(g)": 1, "H2(g)": 3 }, pressureBar: 150, ...eq } as EvaluateRequest["equilibrium"],
  });

  it("ideal is the default: φ = 1, no ideal block, and the result equals the explicit ideal one", () => {
    const a = evaluate(base({}));
    const b = evaluate(base({ gas: "ideal" }));
    expect(a.equilibrium).toEqual(b.equilibrium);
    expect(a.equilibriumInfo!.gas).toBe("ideal");
    expect(Object.values(a.equilibrium![0].fugacityCoefficients)).toEqual([1, 1, 1]);
    expect(a.equilibrium![0].ideal).toBeUndefined();
    expect(a.equilibrium![0].diagnostics.realGas).toBeUndefined();
  });

  it("at 0.01 bar Peng–Robinson and ideal agree to 1e-4 in every mole fraction", () => {
    const r = evaluate({ ...base({ gas: "peng-robinson" }), equilibrium: { feed: { "N2(g)": 1, "H2(g)": 3 }, pressureBar: 0.01, gas: "peng-robinson" } });
    const p = r.equilibrium![0];
    // Derived: at 0.01 bar, ln φ ≈ (b − a/RT) p/RT is of order 1e-4 or less for these gases, so fractions move less than that.
    for (const [k, v] of Object.entries(p.moleFractions)) expect(Math.abs(v - p.ideal!.moleFractions[k])).toBeLessThan(1e-4);
  });

  it("an inert feed species takes its constants from equilibrium.critical, and changes φ of the others", () => {
    const withCh4 = evaluate(base({ gas: "peng-robinson", feed: { "N2(g)": 1, "H2(g)": 3, "CH4(g)": 0.5 }, critical: { "CH4(g)": C.CH4 } }));
    const without = evaluate(base({ gas: "peng-robinson" }));
    expect(withCh4.equilibrium![0].fugacityCoefficients["CH4(g)"]).toBeGreaterThan(0);
    expect(withCh4.equilibrium![0].fugacityCoefficients["NH3(g)"]).not.toBeCloseTo(without.equilibrium![0].fugacityCoefficients["NH3(g)"], 4);
  });

  it("a binary interaction parameter changes the answer; kij = 0 given equals kij omitted", () => {
    const none = evaluate(base({ gas: "peng-robinson" })).equilibrium![0];
    const zero = evaluate(base({ gas: "peng-robinson", kij: [{ species: ["N2(g)", "H2(g)"], value: 0 }] })).equilibrium![0];
    const some = evaluate(base({ gas: "peng-robinson", kij: [{ species: ["NH3(g)", "H2(g)"], value: 0.2 }] })).equilibrium![0];
    expect(zero).toEqual(none);
    // Common practice: a kij of 0.2 is large; it must move the ammonia fraction visibly (more than 1e-4).
    expect(Math.abs(some.moleFractions["NH3(g)"] - none.moleFractions["NH3(g)"])).toBeGreaterThan(1e-4);
  });

  it("reforming and shift together converge with Peng–Robinson at 25 bar, elements balanced", () => {
    const species = Object.fromEntries(["CH4", "H2O", "CO", "H2", "CO2"].map((n) => [`${n}(g)`, gas(n)]));
    const r = evaluate({
      reaction: "CH4(g) + H2O(g) -> CO(g) + 3 H2(g)",
      species,
      temperatures: { listK: [900, 1000, 1100] },
      equilibrium: {
        feed: { "CH4(g)": 1, "H2O(g)": 3 },
        pressureBar: 25,
        gas: "peng-robinson",
        reactions: ["CH4(g) + H2O(g) -> CO(g) + 3 H2(g)", "CO(g) + H2O(g) -> CO2(g) + H2(g)"],
      },
    });
    for (const p of r.equilibrium!) {
      expect(p.converged).toBe(true);
      const el = (m: Record<string, number>) => {
        const out: Record<string, number> = {};
        for (const [k, v] of Object.entries(m)) for (const [e, c] of Object.entries(parseFormula(k.replace("(g)", "")).elements)) out[e] = (out[e] ?? 0) + c * v;
        return out;
      };
      const a = el(p.moles);
      expect(a.C).toBeCloseTo(1, 12);
      expect(a.O).toBeCloseTo(3, 12);
      expect(a.H).toBeCloseTo(10, 12);
      // Common practice: at 25 bar and 900–1100 K these gases are close to ideal (φ within a few per cent of 1).
      for (const v of Object.values(p.fugacityCoefficients)) expect(v).toBeGreaterThan(0.9);
    }
  });
});

describe("real-gas refusals", () => {
  const req = (over: Record<string, unknown> = {}, species: Record<string, SpeciesInput> = ammoniaSpecies()) => ({
    reaction: AMMONIA,
    species,
    temperatures: { listK: [700] },
    equilibrium: { feed: { "N2(g)": 1, "H2(g)": 3 }, pressureBar: 150, gas: "peng-robinson", ...over },
  });

  it("a gas without critical constants", () => {
    const sp = ammoniaSpecies();
    delete (sp["NH3(g)"] as { critical?: unknown }).critical;
    const e = refusal(req({}, sp));
    expect(e.code).toBe("missing-critical");
    expect(e.message).toBe(
      'equilibrium.gas: "peng-robinson" needs critical constants for every gas of the mixture; "NH3(g)" has none (give species["NH3(g)"].critical as { tcK, pcBar, omega })',
    );
    const inert = refusal(req({ feed: { "N2(g)": 1, "H2(g)": 3, "Ar(g)": 0.1 } }));
    expect(inert.message).toBe(
      'equilibrium.gas: "peng-robinson" needs critical constants for every gas of the mixture; "Ar(g)" has none (give equilibrium.critical["Ar(g)"] as { tcK, pcBar, omega })',
    );
  });

  it("constants given twice, or for a species not in the mixture", () => {
    expect(refusal(req({ critical: { "N2(g)": C.N2 } })).message).toBe(
      'equilibrium.critical["N2(g)"]: "N2(g)" has an entry in species; give its constants once, in species["N2(g)"].critical',
    );
    expect(refusal(req({ critical: { "Ar(g)": C.N2 } })).message).toBe('equilibrium.critical["Ar(g)"]: "Ar(g)" is not a species of the mixture (feed or reactions)');
  });

  it("kij of an unknown species or of a species with itself", () => {
    expect(refusal(req({ kij: [{ species: ["N2(g)", "Ar(g)"], value: 0.1 }] })).message).toBe('equilibrium.kij[0]: "Ar(g)" is not a species of the mixture (feed or reactions)');
    expect(refusal(req({ kij: [{ species: ["N2(g)", "N2(g)"], value: 0.1 }] })).code).toBe("invalid-kij");
  });

  it("strict objects and ranges: a misspelt field, an unknown gas model, a negative Tc, a kij out of range", () => {
    const sp = ammoniaSpecies();
    (sp["N2(g)"] as { critical: unknown }).critical = { tcK: 126.2, pcBar: 33.98, omega: 0.037, tc: 1 };
    expect(refusal(req({}, sp)).message).toMatch(/^invalid request: species\["N2\(g\)"\]\.critical: /);
    expect(refusal(req({ gas: "van-der-waals" })).message).toBe('invalid request: equilibrium.gas: expected "ideal" or "peng-robinson"');
    const neg = ammoniaSpecies();
    (neg["N2(g)"] as { critical: unknown }).critical = { tcK: -1, pcBar: 33.98, omega: 0.037 };
    expect(refusal(req({}, neg)).message).toBe('invalid request: species["N2(g)"].critical.tcK: a critical temperature must be above 0 K');
    expect(refusal(req({ kij: [{ species: ["N2(g)", "H2(g)"], value: 3 }] })).message).toBe("invalid request: equilibrium.kij[0].value: k_ij runs from -1 to 1");
    expect(refusal(req({ kij: [{ species: ["N2(g)", "H2(g)"], value: 0, extra: 1 }] })).code).toBe("invalid-request");
  });
});
