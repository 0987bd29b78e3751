/**
 * Stage 4b of evaluate(): the 1σ of ΔrG and log10 K on the grid by linear propagation of the
 * species' uncertainties (uncertainty.ts), in typed arrays beside the values they cover.
 */
import { R as GAS_CONSTANT } from "./constants";
import type { ReactionGrid, Term } from "./reaction-grid";
import { termAt } from "./term";
import { combine, sigmaG, sigmaGNaive, type SpeciesUncertainty } from "./uncertainty";
import { UNCERTAINTY_BASIS, type UncertaintySummary } from "./evaluate-types";

const LN10 = Math.LN10;
const R = GAS_CONSTANT;

/** Per grid temperature: 1σ of ΔrG (kJ/mol), of log10 K, of the naive ΔrG, and |naive − corrected| > 1σ. */
export interface Sigmas {
  dGkJ: Float64Array;
  log10K: Float64Array;
  naiveDGkJ: Float64Array;
  exceeds: Uint8Array;
}

/** Null when no species carries an uncertainty. */
export function reactionSigmas(
  terms: readonly Term[],
  uncertain: readonly (SpeciesUncertainty | null)[],
  T: Float64Array,
  referenceK: number,
  rg: ReactionGrid,
): { sigmas: Sigmas; summary: UncertaintySummary } | null {
  if (!uncertain.some((u) => u !== null)) return null;
  const n = T.length;
  const { grids, naive, dG } = rg;
  const refs = terms.map((t) => termAt(t.model, t.phase, referenceK));
  const nus = terms.map((t) => t.nu);
  const naiveExceedsK: number[] = [];
  const m = terms.length;
  const sig = new Float64Array(m);
  const sigN = new Float64Array(m);
  const sigmas: Sigmas = { dGkJ: new Float64Array(n), log10K: new Float64Array(n), naiveDGkJ: new Float64Array(n), exceeds: new Uint8Array(n) };
  for (let i = 0; i < n; i++) {
    const t = T[i];
    for (let k = 0; k < m; k++) {
      const u = uncertain[k];
      sig[k] = u ? sigmaG(u, t, grids[k].h[i], grids[k].s[i], refs[k].hJ, refs[k].sJ) : 0;
      sigN[k] = u ? sigmaGNaive(u, t) : 0;
    }
    const sG = combine(nus, sig);
    const sigmaDGkJ = sG / 1000;
    sigmas.dGkJ[i] = sigmaDGkJ;
    sigmas.log10K[i] = sG / (R * t * LN10);
    sigmas.naiveDGkJ[i] = combine(nus, sigN) / 1000;
    const exceeds = Math.abs((naive[i] - dG[i]) / 1000) > sigmaDGkJ;
    sigmas.exceeds[i] = exceeds ? 1 : 0;
    if (exceeds) naiveExceedsK.push(t);
  }
  const summary: UncertaintySummary = {
    basis: UNCERTAINTY_BASIS,
    species: Object.fromEntries(terms.flatMap((t, k) => (uncertain[k] ? [[t.key, uncertain[k]!]] : []))),
    naiveExceedsK,
  };
  return { sigmas, summary };
}
