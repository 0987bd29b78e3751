/**
 * Adiabatic outlet temperature: a hand-worked constant-Cp shift example, the closed-form
 * energy balance for constant Cp at the engine's own extent, the naive constant-ΔrH figure,
 * published-data systems (shift with an inert, endothermic reforming), and refusals.
 * Bounds of 1e-6 and tighter compare two computations of one number (closed form, independent
 * bisection): round-off allowances, common practice.
 */
import { describe, expect, it } from "vitest";
import { evaluate, EngineRefusal, speciesProperties, type EvaluateRequest, type SpeciesInput } from "@/lib/thermo";
import { CRITICAL_CONSTANTS as C } from "@/seeders/critical-constants";
import { speciesEntry } from "./reference-data";

const R = 8.314462618;
const TREF = 298.15;
const SHIFT = "CO(g) + H2O(g) -> CO2(g) + H2(g)";

/**
 * Constant-Cp species, synthetic, invented for this test: Cp rounded to values typical near
 * 700 K (CO 31, H2O 37, CO2 48, H2 29.5, N2 30 J/(mol·K)); anchors at 298.15 K are the CODATA /
 * NIST-JANAF ΔfH° and S° (from memory).
 */
const CP: Record<string, number> = { CO: 31, H2O: 37, CO2: 48, H2: 29.5, N2: 30 };
const HF: Record<string, number> = { CO: -110.53, H2O: -241.83, CO2: -393.51, H2: 0, N2: 0 };
const S0: Record<string, number> = { CO: 197.66, H2O: 188.84, CO2: 213.79, H2: 130.68, N2: 191.61 };
const constant = (n: string): SpeciesInput => ({
  segments: [{ phase: "g", form: "constant", tminK: 200, tmaxK: 3000, coeffs: { cpJ: CP[n] } }],
  reference: { tK: TREF, phase: "g", hkJ: HF[n], sJ: S0[n] },
});
const constantSet = () => Object.fromEntries(["CO", "H2O", "CO2", "H2", "N2"].map((n) => [`${n}(g)`, constant(n)]));
const dH0 = (HF.CO2 + HF.H2 - HF.CO - HF.H2O) * 1000; // −41 150 J/mol
const dS0 = S0.CO2 + S0.H2 - S0.CO - S0.H2O; // −42.03 J/(mol·K)
const dCp = CP.CO2 + CP.H2 - CP.CO - CP.H2O; // 9.5 J/(mol·K)

function refusal(req: unknown): EngineRefusal {
  try {
    evaluate(req);
  } catch (e) {
    if (e instanceof EngineRefusal) return e;
    throw e;
  }
  throw new Error("expected a refusal");
}

describe("hand-worked example: equimolar CO + H2O entering at 600 K, constant Cp", () => {
  /*
   * Worked by hand (synthetic data above). Shift has Δn = 0, so for a 1:1 feed
   *   K = ξ² / (1 − ξ)²  →  ξ = √K / (1 + √K),
   *   ln K(T) = −[ΔrH° + ΔCp (T − T°)]/RT + [ΔrS° + ΔCp ln(T/T°)]/R,
   * with ΔrH° = −41.15 kJ/mol, ΔrS° = −42.03 J/(mol·K), ΔCp = +9.5 J/(mol·K).
   * Energy balance (heat the feed to T, react at T):
   *   (Cp,CO + Cp,H2O)(T − 600) + ξ(T) [ΔrH° + ΔCp (T − T°)] = 0.
   * At 600 K, K = 30.50 (ξ = 0.8467): the balance is negative, the gas heats up. Bisection
   * gives T = 914.81 K, where K = 2.377 and ξ = 0.6066: a 315 K rise.
   * Naive (ΔrH and ΔrS at T°, no ΔCp): 68 (T − 600) + ξn(T) ΔrH° = 0 → T = 924.92 K, ξn = 0.5369.
   */
  const req: EvaluateRequest = {
    reaction: SHIFT,
    species: constantSet(),
    temperatures: { listK: [600] },
    equilibrium: { feed: { "CO(g)": 1, "H2O(g)": 1 }, pressureBar: 1 },
    adiabatic: { inletK: 600 },
  };
  const r = evaluate(req);
  const a = r.adiabatic!;

  const lnK = (T: number) => -(dH0 + dCp * (T - TREF)) / (R * T) + (dS0 + dCp * Math.log(T / TREF)) / R;
  const xi = (T: number) => Math.exp(lnK(T) / 2) / (1 + Math.exp(lnK(T) / 2));
  const bisect = (f: (t: number) => number, lo: number, hi: number) => {
    for (let i = 0; i < 200; i++) {
      const m = 0.5 * (lo + hi);
      if (f(m) > 0) hi = m;
      else lo = m;
    }
    return 0.5 * (lo + hi);
  };

  it("the corrected outlet is the hand-worked 914.81 K, and an independent bisection to 1e-6 K", () => {
    const T = bisect((t) => 68 * (t - 600) + xi(t) * (dH0 + dCp * (t - TREF)), 600, 1500);
    expect(Math.abs(a.outletK - T)).toBeLessThan(1e-6);
    // The hand-worked figures, to the digits they are given with.
    expect(a.outletK).toBeCloseTo(914.81, 2);
    expect(a.outlet.extents[0]).toBeCloseTo(0.6066, 4);
    expect(a.riseK).toBeCloseTo(914.81 - 600, 2);
  });

  it("the naive outlet (constant ΔrH, naive K) is the hand-worked 924.92 K", () => {
    const lnKn = (T: number) => -dH0 / (R * T) + dS0 / R;
    const xin = (T: number) => Math.exp(lnKn(T) / 2) / (1 + Math.exp(lnKn(T) / 2));
    const Tn = bisect((t) => 68 * (t - 600) + xin(t) * dH0, 600, 1500);
    expect(Math.abs(a.naiveOutletK - Tn)).toBeLessThan(1e-6);
    expect(a.naiveOutletK).toBeCloseTo(924.92, 2);
    expect(a.diffK).toBeCloseTo(a.naiveOutletK - a.outletK, 12);
  });

  it("reports the bracket it searched and the iterations inside it", () => {
    expect(a.bracketK[0]).toBeLessThan(a.outletK);
    expect(a.bracketK[1]).toBeGreaterThan(a.outletK);
    expect(a.bracketK[0]).toBeGreaterThanOrEqual(600);
    // Derived: halving a bracket of a few thousand kelvin to below 1e-9 K takes about 42 steps; 60 bounds it.
    expect(a.iterations).toBeGreaterThan(0);
    expect(a.iterations).toBeLessThan(60);
    expect(a.naiveBracketK[0]).toBeLessThan(a.naiveOutletK);
    expect(a.naiveBracketK[1]).toBeGreaterThan(a.naiveOutletK);
    expect(a.inletK).toBe(600);
  });
});

describe("closed-form energy balance for constant Cp", () => {
  // With constant Cp: Σ n0 Cp (T − Tin) + ξ [ΔrH° + ΔCp (T − T°)] = 0 is linear in T at the
  // outlet's own ξ:  T = [Σ n0 Cp · Tin − ξ (ΔrH° − ΔCp T°)] / (Σ n0 Cp + ξ ΔCp).
  // Naive: T = Tin − ξn ΔrH° / Σ n0 Cp. Feeds synthetic, invented for this test; N2 inert.
  const feeds: { feed: Record<string, number>; inletK: number; pBar: number }[] = [
    { feed: { "CO(g)": 13, "H2O(g)": 38, "CO2(g)": 6, "H2(g)": 40, "N2(g)": 3 }, inletK: 590, pBar: 30 },
    { feed: { "CO(g)": 1, "H2O(g)": 5 }, inletK: 480, pBar: 1 },
    { feed: { "CO(g)": 2, "H2O(g)": 1, "N2(g)": 10 }, inletK: 700, pBar: 5 },
    // reverse shift: a CO2/H2 feed cools as it reacts
    { feed: { "CO2(g)": 1, "H2(g)": 1 }, inletK: 1200, pBar: 1 },
  ];
  for (const f of feeds) {
    it(`feed ${JSON.stringify(f.feed)} at ${f.inletK} K: outlet T from the closed form at the engine's ξ to 1e-6 K`, () => {
      const r = evaluate({
        reaction: SHIFT,
        species: constantSet(),
        temperatures: { listK: [f.inletK] },
        equilibrium: { feed: f.feed, pressureBar: f.pBar },
        adiabatic: { inletK: f.inletK },
      });
      const a = r.adiabatic!;
      const sumCp = Object.entries(f.feed).reduce((s, [k, n]) => s + n * CP[k.replace("(g)", "")], 0);
      const x = a.outlet.extents[0];
      const T = (sumCp * f.inletK - x * (dH0 - dCp * TREF)) / (sumCp + x * dCp);
      expect(Math.abs(a.outletK - T)).toBeLessThan(1e-6);
      const xn = a.naiveOutlet.extents[0];
      expect(Math.abs(a.naiveOutletK - (f.inletK - (xn * dH0) / sumCp))).toBeLessThan(1e-6);
      // Direction: exothermic forward heats, backward (reverse shift) cools.
      expect(Math.sign(a.riseK)).toBe(Math.sign(x));
      // Common practice: an energy balance closed to a millijoule per feed unit.
      expect(a.balanceResidualJ).toBeLessThan(1e-3);
    });
  }
});

describe("published-data systems (Shomate fits to NIST-JANAF)", () => {
  const shomate = (n: string): SpeciesInput => ({ ...speciesEntry("shomate-janaf", n, "g"), critical: C[n] });

  it("shift converter with inert methane: the outlet enthalpy equals the inlet's, and the inert's entry is required", () => {
    const species = Object.fromEntries(["CO", "H2O", "CO2", "H2", "CH4"].map((n) => [`${n}(g)`, shomate(n)]));
    const feed = { "CO(g)": 13, "H2O(g)": 38, "CO2(g)": 6, "H2(g)": 40, "CH4(g)": 3 };
    const req = {
      reaction: SHIFT,
      species,
      temperatures: { listK: [600, 700] },
      include: ["species"] as "species"[],
      equilibrium: { feed, pressureBar: 30 },
      adiabatic: { inletK: 600 },
    };
    const a = evaluate(req).adiabatic!;
    // Derived from the closed form above: ξ ≤ 13 (all the CO), ΔrH ≈ −39 kJ/mol and Σ n0 Cp ≈ 3.4 kJ/K bound the
    // rise by about 150 K; 650 K says at least about a third of the CO shifts. The exact figure is the balance checked next.
    expect(a.outletK).toBeGreaterThan(650);
    expect(a.outletK).toBeLessThan(760);
    // Independent check of the balance from the engine's per-species H at the two temperatures.
    const h = (k: string, T: number) => speciesProperties(species[k], [T]).rows[0].hkJ;
    const x = a.outlet.extents[0];
    const out = { "CO(g)": 13 - x, "H2O(g)": 38 - x, "CO2(g)": 6 + x, "H2(g)": 40 + x, "CH4(g)": 3 };
    let balance = 0;
    for (const [k, n] of Object.entries(out)) balance += n * h(k, a.outletK) - feed[k as keyof typeof feed] * h(k, 600);
    expect(Math.abs(balance)).toBeLessThan(1e-6); // kJ per feed unit
    const noInert = { ...species } as Record<string, SpeciesInput>;
    delete noInert["CH4(g)"];
    const e = refusal({ ...req, species: noInert });
    expect(e.code).toBe("missing-species");
    expect(e.message).toBe('species "CH4(g)" is in equilibrium.feed and carries heat in the adiabatic balance, but has no entry in species');
  });

  it("steam reforming at 1100 K cools (endothermic), searched downward; ammonia bed heats, with Peng–Robinson too", () => {
    const species = Object.fromEntries(["CH4", "H2O", "CO", "H2", "CO2"].map((n) => [`${n}(g)`, shomate(n)]));
    const ref = evaluate({
      reaction: "CH4(g) + H2O(g) -> CO(g) + 3 H2(g)",
      species,
      temperatures: { listK: [1100] },
      equilibrium: { feed: { "CH4(g)": 1, "H2O(g)": 3 }, pressureBar: 25, reactions: ["CH4(g) + H2O(g) -> CO(g) + 3 H2(g)", "CO(g) + H2O(g) -> CO2(g) + H2(g)"] },
      adiabatic: { inletK: 1100 },
    }).adiabatic!;
    // Common practice: an adiabatic reformer bed at 1100 K cools by a few hundred kelvin; the ammonia bed heats by
    // more than 100 K (the signs are what is checked; the magnitudes are loose on purpose).
    expect(ref.riseK).toBeLessThan(-100);
    expect(ref.bracketK[1]).toBeLessThanOrEqual(1100);
    expect(ref.bracketK[0]).toBeLessThan(ref.outletK);
    const nh3 = { "N2(g)": shomate("N2"), "H2(g)": shomate("H2"), "NH3(g)": shomate("NH3") };
    const base = { reaction: "N2(g) + 3 H2(g) -> 2 NH3(g)", species: nh3, temperatures: { listK: [653] }, adiabatic: { inletK: 653 } };
    const ideal = evaluate({ ...base, equilibrium: { feed: { "N2(g)": 1, "H2(g)": 3, "NH3(g)": 0.04 }, pressureBar: 150 } }).adiabatic!;
    const pr = evaluate({ ...base, equilibrium: { feed: { "N2(g)": 1, "H2(g)": 3, "NH3(g)": 0.04 }, pressureBar: 150, gas: "peng-robinson" } }).adiabatic!;
    expect(ideal.riseK).toBeGreaterThan(100);
    // More ammonia at equilibrium with real-gas fugacities: a hotter outlet.
    expect(pr.outletK).toBeGreaterThan(ideal.outletK);
  });
});

describe("adiabatic refusals", () => {
  const base = {
    reaction: SHIFT,
    species: constantSet(),
    temperatures: { listK: [600] },
    equilibrium: { feed: { "CO(g)": 1, "H2O(g)": 1 } },
  };
  it("needs an equilibrium feed", () => {
    const { equilibrium: _eq, ...noEq } = base;
    const e = refusal({ ...noEq, adiabatic: { inletK: 600 } });
    expect(e.code).toBe("adiabatic-needs-equilibrium");
    expect(e.message).toBe("adiabatic: an adiabatic outlet needs an equilibrium feed; add equilibrium { feed, pressureBar }");
  });
  it("a non-positive inlet, an inlet with units, a misspelt field", () => {
    expect(refusal({ ...base, adiabatic: { inletK: 0 } }).message).toBe("adiabatic.inletK: temperatures must be above 0 K (got 0 K)");
    expect(evaluate({ ...base, adiabatic: { inletK: "326.85 degC" } }).adiabatic!.inletK).toBeCloseTo(600, 9);
    const e = refusal({ ...base, adiabatic: { inletK: 600, outletK: 700 } });
    expect(e.code).toBe("invalid-request");
    expect(e.message).toMatch(/^invalid request: adiabatic: /);
  });
});
