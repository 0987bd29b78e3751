/**
 * Real-gas equilibrium: the gas phase's fugacity coefficients from the Peng–Robinson
 * equation (eos.ts), solved self-consistently with the composition. At fixed φ the
 * equilibrium condition Σ ν_i [μ°_i/RT + ln(φ_i x_i p/p°)] = 0 is the ideal-gas one with
 * μ°_i/RT shifted by ln φ_i (K replaced by K/Π φ_i^ν_i), so the ideal solver is reused:
 * φ from the composition → solve → repeat until ln φ stops changing.
 */
import { refuse } from "./errors";
import { prMixture, type CriticalConstants } from "./eos";
import type { EquilibriumProblem, EquilibriumSolution } from "./equilibrium-solver";
import type { GAS_MODELS, ParsedSpecies } from "./schema";

export type GasModel = (typeof GAS_MODELS)[number];

/** Successive substitution stops when max |Δ ln φ| falls below this. */
export const REAL_GAS_TOLERANCE = 1e-10;
export const REAL_GAS_MAX_ITERATIONS = 200;

export interface RealGasSetup {
  pressureBar: number;
  /** Per species index of the set; null for a species without constants (then it must never be in the gas). */
  critical: (CriticalConstants | null)[];
  /** Symmetric k_ij over the species indices of the set. */
  kij: number[][];
}

export interface RealGasDiagnostics {
  /** Outer (φ ↔ composition) iterations. */
  iterations: number;
  converged: boolean;
  /** max |Δ ln φ| of the last iteration. */
  change: number;
  /** Compressibility factor of the equilibrium gas. */
  z: number;
  /** The chosen root is liquid-like (the cubic had several): a phase split may be possible. */
  liquidLike: boolean;
}

export interface RealGasSolution {
  solution: EquilibriumSolution;
  /** The ideal-gas solution the iteration started from. */
  ideal: EquilibriumSolution;
  /** φ_i per species index (1 for condensed and absent species). */
  phi: Float64Array;
  diagnostics: RealGasDiagnostics;
}

interface SpeciesRef {
  key: string;
  reacting: boolean;
}

/**
 * The constants of every species the gas may hold, from `species[key].critical` or (for an
 * inert feed species without an entry) `equilibrium.critical[key]`, and the k_ij matrix.
 * Refuses a gas without constants, constants given twice, and k_ij of unknown pairs.
 */
export function realGasSetup(
  list: readonly SpeciesRef[],
  mayBeGas: (i: number) => boolean,
  species: Record<string, ParsedSpecies>,
  eq: { critical?: Record<string, CriticalConstants>; kij?: { species: [string, string]; value: number }[] },
  pressureBar: number,
): RealGasSetup {
  const has = (o: object, k: string) => Object.prototype.hasOwnProperty.call(o, k);
  const index = new Map(list.map((s, i) => [s.key, i]));
  for (const key of Object.keys(eq.critical ?? {})) {
    if (!index.has(key)) {
      refuse("invalid-critical", `equilibrium.critical["${key}"]: "${key}" is not a species of the mixture (feed or reactions)`, { key });
    }
    if (has(species, key)) {
      refuse("invalid-critical", `equilibrium.critical["${key}"]: "${key}" has an entry in species; give its constants once, in species["${key}"].critical`, { key });
    }
  }
  const critical = list.map((s, i): CriticalConstants | null => {
    const own = has(species, s.key) ? species[s.key].critical : undefined;
    const c = own ?? eq.critical?.[s.key];
    if (!c && mayBeGas(i)) {
      const where = has(species, s.key) ? `species["${s.key}"].critical` : `equilibrium.critical["${s.key}"]`;
      refuse(
        "missing-critical",
        `equilibrium.gas: "peng-robinson" needs critical constants for every gas of the mixture; "${s.key}" has none (give ${where} as { tcK, pcBar, omega })`,
        { species: s.key },
      );
    }
    return c ?? null;
  });
  const S = list.length;
  const kij = Array.from({ length: S }, () => new Array<number>(S).fill(0));
  (eq.kij ?? []).forEach((entry, j) => {
    const [a, b] = entry.species;
    for (const key of [a, b]) {
      if (!index.has(key)) refuse("invalid-kij", `equilibrium.kij[${j}]: "${key}" is not a species of the mixture (feed or reactions)`, { index: j, key });
    }
    if (a === b) refuse("invalid-kij", `equilibrium.kij[${j}]: a binary interaction parameter needs two different species (got "${a}" twice)`, { index: j });
    const i1 = index.get(a)!;
    const i2 = index.get(b)!;
    kij[i1][i2] = kij[i2][i1] = entry.value;
  });
  return { pressureBar, critical, kij };
}

/** Fugacity coefficients of the gas at amounts n (condensed and absent species get φ = 1). */
export function gasPhi(p: EquilibriumProblem, moles: Float64Array, setup: RealGasSetup, tK: number): { lnPhi: Float64Array; z: number; liquidLike: boolean } {
  const S = moles.length;
  const idx: number[] = [];
  for (let i = 0; i < S; i++) if (p.gas[i] && setup.critical[i]) idx.push(i);
  const lnPhi = new Float64Array(S);
  if (idx.length === 0) return { lnPhi, z: 1, liquidLike: false };
  let total = 0;
  for (const i of idx) total += moles[i];
  // All gas exhausted cannot happen with a positive feed; guard against it anyway.
  const y = idx.map((i) => (total > 0 ? moles[i] / total : 1 / idx.length));
  const kij = idx.map((i) => idx.map((j) => setup.kij[i][j]));
  const r = prMixture(
    tK,
    setup.pressureBar,
    y,
    idx.map((i) => setup.critical[i]!),
    kij,
  );
  idx.forEach((i, q) => (lnPhi[i] = r.lnPhi[q]));
  return { lnPhi, z: r.z, liquidLike: r.liquidLike };
}

/**
 * Solve with fugacity coefficients consistent with the composition. Successive substitution
 * on ln φ; after 20 iterations without convergence the update is damped by half.
 */
export function solveRealGas(p: EquilibriumProblem, setup: RealGasSetup, tK: number, solve: (p: EquilibriumProblem) => EquilibriumSolution): RealGasSolution {
  const ideal = solve(p);
  const S = p.n0.length;
  let sol = ideal;
  let lnPhi = new Float64Array(S);
  let last = gasPhi(p, sol.moles, setup, tK);
  let change = Infinity;
  let iterations = 0;
  let converged = false;
  const g = new Float64Array(S);
  for (; iterations < REAL_GAS_MAX_ITERATIONS; iterations++) {
    const target = last.lnPhi;
    const w = iterations < 20 ? 1 : 0.5;
    const next = new Float64Array(S);
    change = 0;
    for (let i = 0; i < S; i++) {
      next[i] = lnPhi[i] + w * (target[i] - lnPhi[i]);
      change = Math.max(change, Math.abs(target[i] - lnPhi[i]));
    }
    if (change < REAL_GAS_TOLERANCE) {
      converged = true;
      break;
    }
    lnPhi = next;
    for (let i = 0; i < S; i++) g[i] = p.g[i] + (p.gas[i] ? lnPhi[i] : 0);
    sol = solve({ ...p, g: Float64Array.from(g) });
    last = gasPhi(p, sol.moles, setup, tK);
  }
  const phi = new Float64Array(S);
  for (let i = 0; i < S; i++) phi[i] = p.gas[i] ? Math.exp(last.lnPhi[i]) : 1;
  return {
    solution: { ...sol, converged: sol.converged && converged },
    ideal,
    phi,
    diagnostics: { iterations, converged, change, z: last.z, liquidLike: last.liquidLike },
  };
}
