/**
 * Adiabatic outlet temperature of an equilibrium reactor: the T at which the enthalpy of the
 * equilibrium outlet equals that of the feed at the inlet temperature,
 *
 *   F(T) = Σ_i n_i(T) H_i(T) − Σ_i n0_i H_i(T_in) = 0,
 *
 * with H_i the Kirchhoff (formation-basis) enthalpy of every species from its own models and
 * n_i(T) the equilibrium outlet at T (corrected K, same gas model). The naive figure keeps the
 * reaction enthalpy at its reference-temperature value and the naive K:
 *
 *   F_naive(T) = Σ_i n0_i [H_i(T) − H_i(T_in)] + Σ_j ξ_naive,j(T) · ΔrH_j(T_ref) = 0.
 *
 * Both roots are found by bracketing outward from the inlet (steps of 25 K, doubling) and
 * Brent's method inside the bracket. H is the ideal-gas enthalpy; with a real-gas equation the
 * outlet composition carries the fugacity coefficients but the residual enthalpy is neglected.
 */
import { refuse } from "./errors";
import { requireAboveZeroK } from "./grid";
import type { Composition, EquilibriumContext } from "./equilibrium";
import { brent } from "./roots";
import { fmt, termAt, type EngineWarning, type SpeciesModel } from "./species";
import { parseTemperatureK } from "./units";

/** The bracket search never leaves this range (K). */
export const ADIABATIC_MIN_K = 100;
export const ADIABATIC_MAX_K = 6000;
/** Brent's tolerance on the outlet temperature (K). */
export const ADIABATIC_XTOL_K = 1e-7;

export interface AdiabaticOutlet {
  moleFractions: Record<string, number>;
  keyConversion: number;
  extents: number[];
}

export interface AdiabaticResult {
  inletK: number;
  /** Corrected: Kirchhoff H of every species and the corrected equilibrium. */
  outletK: number;
  /** Constant ΔrH(Tref) and the naive equilibrium. */
  naiveOutletK: number;
  /** naiveOutletK − outletK. */
  diffK: number;
  /** Sign-change bracket of the corrected balance, and the balance evaluations Brent used inside it. */
  bracketK: [number, number];
  iterations: number;
  naiveBracketK: [number, number];
  naiveIterations: number;
  /** Temperature rise outletK − inletK (negative for an endothermic reaction). */
  riseK: number;
  naiveRiseK: number;
  /** Equilibrium outlet at outletK (corrected) and at naiveOutletK (naive). */
  outlet: AdiabaticOutlet;
  naiveOutlet: AdiabaticOutlet;
  /** |F(outletK)|: the enthalpy balance left at the corrected outlet, J per the feed's unit of amount. */
  balanceResidualJ: number;
}

export interface AdiabaticInput {
  adiabatic: { inletK: number | string };
  context: EquilibriumContext | undefined;
  hasEntry: (key: string) => boolean;
  models: Map<string, SpeciesModel>;
  buildModel: (key: string) => SpeciesModel;
  referenceK: number;
}

function outletOf(c: Composition): AdiabaticOutlet {
  return { moleFractions: c.moleFractions, keyConversion: c.keyConversion, extents: c.extents };
}

/** Bracket a sign change of f outward from x0 (f(x0) given), then Brent; counts f evaluations. */
function bracketRoot(f: (t: number) => number, x0: number, f0: number, what: string): { root: number; bracket: [number, number]; iterations: number } {
  if (f0 === 0) return { root: x0, bracket: [x0, x0], iterations: 0 };
  // F rises with T (heat capacities are positive), so a negative balance means the outlet is hotter.
  const up = f0 < 0;
  let a = x0;
  let fa = f0;
  let step = 25;
  for (;;) {
    const b = up ? Math.min(ADIABATIC_MAX_K, a + step) : Math.max(ADIABATIC_MIN_K, a - step);
    const fb = f(b);
    if (!Number.isFinite(fb)) break;
    if (fb === 0) return { root: b, bracket: up ? [a, b] : [b, a], iterations: 0 };
    if (fa * fb < 0) {
      let iterations = 0;
      const counted = (t: number) => {
        iterations++;
        return f(t);
      };
      const root = brent(counted, a, b, fa, fb, ADIABATIC_XTOL_K, 200);
      return { root, bracket: up ? [a, b] : [b, a], iterations };
    }
    if (b === ADIABATIC_MAX_K || b === ADIABATIC_MIN_K) break;
    a = b;
    fa = fb;
    step *= 2;
  }
  refuse("no-adiabatic-outlet", `adiabatic: the ${what} enthalpy balance has no root between ${ADIABATIC_MIN_K} K and ${ADIABATIC_MAX_K} K from the inlet at ${fmt(x0)} K`, {
    inletK: x0,
    rangeK: [ADIABATIC_MIN_K, ADIABATIC_MAX_K],
  });
}

/**
 * The adiabatic outlet, corrected and naive. Refuses without an equilibrium feed, with a feed
 * species that has no entry in species (it carries heat), and with a non-positive inlet.
 */
export function adiabaticOutlet(input: AdiabaticInput): { result: AdiabaticResult; warnings: EngineWarning[] } {
  const ctx = input.context;
  if (!ctx) {
    refuse("adiabatic-needs-equilibrium", "adiabatic: an adiabatic outlet needs an equilibrium feed; add equilibrium { feed, pressureBar }");
  }
  const inletK = parseTemperatureK(input.adiabatic.inletK, "adiabatic.inletK");
  requireAboveZeroK(inletK, "adiabatic.inletK", undefined, fmt(inletK));

  const S = ctx.list.length;
  const models: SpeciesModel[] = ctx.list.map((sp) => {
    let m = input.models.get(sp.key);
    if (!m) {
      if (!input.hasEntry(sp.key)) {
        refuse("missing-species", `species "${sp.key}" is in equilibrium.feed and carries heat in the adiabatic balance, but has no entry in species`, { species: sp.key });
      }
      m = input.buildModel(sp.key);
      input.models.set(sp.key, m);
    }
    return m;
  });
  const H = (i: number, tK: number) => termAt(models[i], ctx.list[i].phase, tK).hJ;
  const hIn = new Float64Array(S);
  for (let i = 0; i < S; i++) hIn[i] = H(i, inletK);
  let feedH = 0;
  for (let i = 0; i < S; i++) feedH += ctx.n0[i] * hIn[i];
  // ΔrH_j(Tref) with each species at its reference-temperature phase (as the naive ΔrG).
  const hRef = ctx.list.map((sp, i) => termAt(models[i], sp.phase, input.referenceK).hJ);
  const dHRef = ctx.nu.map((row) => row.reduce((a, v, i) => a + v * hRef[i], 0));

  const cache = new Map<number, ReturnType<EquilibriumContext["solveAt"]>>();
  const solved = (tK: number) => {
    let s = cache.get(tK);
    if (!s) {
      s = ctx.solveAt(tK);
      cache.set(tK, s);
    }
    return s;
  };
  const balance = (tK: number): number => {
    const { moles } = solved(tK).corrected;
    let out = 0;
    ctx.list.forEach((sp, i) => (out += moles[sp.key] * H(i, tK)));
    return out - feedH;
  };
  const naiveBalance = (tK: number): number => {
    const { extents } = solved(tK).naive;
    let sensible = 0;
    for (let i = 0; i < S; i++) sensible += ctx.n0[i] * (H(i, tK) - hIn[i]);
    return sensible + extents.reduce((a, x, j) => a + x * dHRef[j], 0);
  };

  const corrected = bracketRoot(balance, inletK, balance(inletK), "corrected");
  const naive = bracketRoot(naiveBalance, inletK, naiveBalance(inletK), "naive");
  const out = solved(corrected.root).corrected;
  const outNaive = solved(naive.root).naive;
  const result: AdiabaticResult = {
    inletK,
    outletK: corrected.root,
    naiveOutletK: naive.root,
    diffK: naive.root - corrected.root,
    bracketK: corrected.bracket,
    iterations: corrected.iterations,
    naiveBracketK: naive.bracket,
    naiveIterations: naive.iterations,
    riseK: corrected.root - inletK,
    naiveRiseK: naive.root - inletK,
    outlet: outletOf(out),
    naiveOutlet: outletOf(outNaive),
    balanceResidualJ: Math.abs(balance(corrected.root)),
  };

  const warnings: EngineWarning[] = [];
  for (const [tK, label] of [
    [inletK, "inlet"],
    [corrected.root, "outlet"],
  ] as const) {
    ctx.list.forEach((sp, i) => {
      const phase = termAt(models[i], sp.phase, tK).phase;
      const chain = models[i].chains.get(phase);
      if (chain && (tK < chain.tminK || tK > chain.tmaxK)) {
        warnings.push({
          code: "adiabatic-extrapolation",
          species: sp.key,
          tK,
          message: `the adiabatic ${label} temperature ${fmt(tK)} K is outside the ${fmt(chain.tminK)}–${fmt(chain.tmaxK)} K range of the ${phase} model`,
        });
      }
    });
  }
  return { result, warnings };
}
