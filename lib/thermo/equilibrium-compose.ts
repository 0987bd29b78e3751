/** One temperature's equilibrium problem solved and shaped into a Composition, with linear uncertainty bands. */
import { solveEquilibrium, type EquilibriumProblem, type EquilibriumSolution } from "./equilibrium-solver";
import type { Composition, SetSpecies } from "./equilibrium";
import { solveRealGas, type RealGasSetup } from "./real-gas";

const LN10 = Math.LN10;

/** Solve one problem and shape it; `sigma` (μ°/RT units per species) adds the linear bands. */
export function compose(p: EquilibriumProblem, list: SetSpecies[], k: number, sigma: Float64Array | null, real: RealGasSetup | null, tK: number): Composition {
  const rg = real ? solveRealGas(p, real, tK, solveEquilibrium) : null;
  const sol: EquilibriumSolution = rg ? rg.solution : solveEquilibrium(p);
  const S = list.length;
  const m = sol.moles;
  const fractions = (amounts: Float64Array) => {
    let ng = 0;
    for (let i = 0; i < S; i++) if (p.gas[i]) ng += amounts[i];
    const out: Record<string, number> = {};
    list.forEach((sp, i) => {
      if (p.gas[i]) out[sp.key] = ng > 0 ? amounts[i] / ng : 0;
    });
    return { ng, out };
  };
  const { ng, out: moleFractions } = fractions(m);
  const moles: Record<string, number> = {};
  const fugacityCoefficients: Record<string, number> = {};
  list.forEach((sp, i) => {
    moles[sp.key] = m[i];
    if (p.gas[i]) fugacityCoefficients[sp.key] = rg ? rg.phi[i] : 1;
  });
  const log10K = p.nu.map((row) => -row.reduce((a, v, i) => a + v * p.g[i], 0) / LN10);
  const out: Composition = {
    extents: sol.extents,
    moles,
    moleFractions,
    keyConversion: (p.n0[k] - m[k]) / p.n0[k],
    keyFraction: p.gas[k] ? moleFractions[list[k].key] : null,
    log10K,
    converged: sol.converged,
    diagnostics: { iterations: sol.iterations, residual: sol.residual, atBound: sol.atBound, ...(rg ? { realGas: rg.diagnostics } : {}) },
    fugacityCoefficients,
  };
  if (rg) {
    const im = rg.ideal.moles;
    out.ideal = { moleFractions: fractions(im).out, keyConversion: (p.n0[k] - im[k]) / p.n0[k] };
  }
  if (p.nu.length === 1) out.extent = sol.extents[0];
  if (sigma) {
    // dn_i/dg_q = Σ_j ν_ji · dξ_j/dg_q
    const dn = Array.from({ length: S }, (_, i) => Array.from({ length: S }, (_, q) => p.nu.reduce((a, row, j) => a + row[i] * sol.sensitivity[j][q], 0)));
    const dng = Array.from({ length: S }, (_, q) => dn.reduce((a, row, i) => a + (p.gas[i] ? row[q] : 0), 0));
    const norm = (v: (q: number) => number) => {
      let s = 0;
      for (let q = 0; q < S; q++) s += (v(q) * sigma[q]) ** 2;
      return Math.sqrt(s);
    };
    const sMoles: Record<string, number> = {};
    const sFractions: Record<string, number> = {};
    list.forEach((sp, i) => {
      sMoles[sp.key] = norm((q) => dn[i][q]);
      if (p.gas[i] && ng > 0) sFractions[sp.key] = norm((q) => (dn[i][q] - (m[i] / ng) * dng[q]) / ng);
    });
    out.sigma = {
      extents: sol.sensitivity.map((row) => norm((q) => row[q])),
      moles: sMoles,
      moleFractions: sFractions,
      keyConversion: sMoles[list[k].key] / p.n0[k],
      keyFraction: p.gas[k] ? (sFractions[list[k].key] ?? 0) : null,
      log10K: p.nu.map((row) => norm((q) => row[q]) / LN10),
    };
  }
  return out;
}
