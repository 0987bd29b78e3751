/**
 * Which species' heat capacity moves ΔrG: the corrected − naive ΔrG split exactly by species.
 *
 *   ΔrG(T) − ΔrG_naive(T) = Σ νᵢ [(Hᵢ(T) − Hᵢ(Tref)) − T·(Sᵢ(T) − Sᵢ(Tref))]
 *
 * since ΔrG = Σ νᵢ (Hᵢ(T) − T·Sᵢ(T)) and ΔrG_naive = Σ νᵢ (Hᵢ(Tref) − T·Sᵢ(Tref)). Each term is
 * that species' share of the error of the naive line (its ∫Cp dT − T·∫Cp/T dT from Tref, with
 * any phase change on the way), and the shares add up to −diffKJ.
 *
 * With uncertainties the 1σ of ΔrG, σ = √Σ (νᵢσᵢ)², is split by variance share: species i gets
 * (νᵢσᵢ)²/σ, so the shares add up to σ (sigmaDGkJ) and each is ≥ 0.
 */
import type { SpeciesModel, TermGrid } from "./species";
import { termAt } from "./species";
import { sigmaG, type SpeciesUncertainty } from "./uncertainty";

export interface ContributionTerm {
  key: string;
  nu: number;
  phase?: string;
  model: SpeciesModel;
}

export interface ContributionsResult {
  /** Per species key, kJ/mol per grid point: νᵢ[(Hᵢ(T) − Hᵢ(Tref)) − T·(Sᵢ(T) − Sᵢ(Tref))]; Σ = −diffKJ. */
  contributions: Record<string, number[]>;
  /** Per species key, kJ/mol per grid point: (νᵢσᵢ)²/σ, the species' variance share of sigmaDGkJ; Σ = sigmaDGkJ. Only with uncertainties. */
  contributionsSigma?: Record<string, number[]>;
}

/**
 * Species contributions to corrected − naive ΔrG on the grid T (K). `grids[k]` is term k's
 * properties on T (J units), `uncertain[k]` its parsed uncertainty or null.
 */
export function speciesContributions(
  terms: readonly ContributionTerm[],
  grids: readonly TermGrid[],
  T: Float64Array,
  referenceK: number,
  uncertain: readonly (SpeciesUncertainty | null)[],
): ContributionsResult {
  const n = T.length;
  const refs = terms.map((t) => termAt(t.model, t.phase, referenceK));
  const contributions: Record<string, number[]> = {};
  terms.forEach((term, k) => {
    const g = grids[k];
    const r = refs[k];
    const out = new Array<number>(n);
    for (let i = 0; i < n; i++) out[i] = (term.nu * (g.h[i] - r.hJ - T[i] * (g.s[i] - r.sJ))) / 1000;
    contributions[term.key] = out;
  });
  const result: ContributionsResult = { contributions };
  if (uncertain.some((u) => u !== null)) {
    const shares = terms.map(() => new Array<number>(n));
    const v = new Float64Array(terms.length);
    for (let i = 0; i < n; i++) {
      let total = 0;
      terms.forEach((term, k) => {
        const u = uncertain[k];
        const s = u ? term.nu * sigmaG(u, T[i], grids[k].h[i], grids[k].s[i], refs[k].hJ, refs[k].sJ) : 0;
        v[k] = s * s;
        total += v[k];
      });
      const sigma = Math.sqrt(total);
      for (let k = 0; k < terms.length; k++) shares[k][i] = sigma > 0 ? v[k] / sigma / 1000 : 0;
    }
    result.contributionsSigma = Object.fromEntries(terms.map((t, k) => [t.key, shares[k]]));
  }
  return result;
}
