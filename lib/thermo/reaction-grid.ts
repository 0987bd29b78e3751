/**
 * Stages 2 and 3 of evaluate(): the species models of the reaction's terms, then the
 * reaction's properties on the grid. Per-temperature values stay in typed arrays (J units);
 * point objects are built only at the end (points.ts).
 */
import { R as GAS_CONSTANT } from "./constants";
import { belowBoilingPointWarning } from "./condensation";
import type { ReactionTerm } from "./formula";
import type { Integrator } from "./integrate";
import type { ParsedSpecies } from "./schema";
import { buildSpeciesModel, type EngineWarning, type SpeciesModel } from "./species-model";
import { termAt, termOnGrid, type TermGrid } from "./term";
import { checkFiniteGrid, termWarnings } from "./term-warnings";

/** R read once: under a CommonJS transform an imported binding is an accessor, read on every use in the per-point loops. */
const R = GAS_CONSTANT;

export interface Term {
  key: string;
  nu: number;
  phase?: string;
  model: SpeciesModel;
}

/** ΔrX at one temperature (J units). */
export interface ReactionValues {
  dCp: number;
  dH: number;
  dS: number;
  dG: number;
}

/** The reaction on the grid, J units: corrected ΔrCp, ΔrH, ΔrS, ΔrG and the naive ΔrG(Tref) − T·ΔrS(Tref) line. */
export interface ReactionGrid {
  dCp: Float64Array;
  dH: Float64Array;
  dS: Float64Array;
  dG: Float64Array;
  naive: Float64Array;
  /** Each term's own grid (same order as the terms). */
  grids: TermGrid[];
  ref: ReactionValues;
  /** 0 when every per-point value (including ln K and the naive line) is finite. */
  nonfinite: boolean;
}

/** Stage 2: one model per term, all charged to the request's integrator. */
export function buildTerms(terms: readonly ReactionTerm[], species: Record<string, ParsedSpecies>, referenceK: number, integrator: Integrator): Term[] {
  return terms.map((t) => ({
    key: t.key,
    nu: t.nu,
    phase: t.phase,
    model: buildSpeciesModel(t.key, species[t.key], referenceK, { integrator }),
  }));
}

/** ΔrX at one temperature (J units), with the lowest-G phase chosen per term where unmarked. */
export function reactionAt(terms: readonly Term[], T: number): ReactionValues {
  let dCp = 0;
  let dH = 0;
  let dS = 0;
  for (const t of terms) {
    const v = termAt(t.model, t.phase, T);
    dCp += t.nu * v.cpJ;
    dH += t.nu * v.hJ;
    dS += t.nu * v.sJ;
  }
  return { dCp, dH, dS, dG: dH - T * dS };
}

/**
 * Stage 3: every term on the grid, summed into the reaction's arrays in one pass per term;
 * each term's warnings (termWarnings, below-boiling-point) read its grid once. Refuses a term
 * whose values are not finite (checkFiniteGrid) — found by the same pass, at no extra cost.
 */
export function reactionOnGrid(terms: readonly Term[], species: Record<string, ParsedSpecies>, T: Float64Array, referenceK: number, warnings: EngineWarning[]): ReactionGrid {
  const n = T.length;
  const dCp = new Float64Array(n);
  const dH = new Float64Array(n);
  const dS = new Float64Array(n);
  const grids: TermGrid[] = [];
  for (const term of terms) {
    const g = termOnGrid(term.model, term.phase, T, term.model.chains.size > 1);
    const { cp, h, s } = g;
    const nu = term.nu;
    // x * 0 is 0 for a finite x and NaN otherwise: z stays 0 exactly when every value is finite.
    let z = 0;
    for (let i = 0; i < n; i++) {
      const c = cp[i];
      const hh = h[i];
      const ss = s[i];
      z += c * 0 + hh * 0 + ss * 0;
      dCp[i] += nu * c;
      dH[i] += nu * hh;
      dS[i] += nu * ss;
    }
    if (z !== 0) checkFiniteGrid(term.key, g, T);
    grids.push(g);
    for (const w of termWarnings(term.model, term.phase, T, g, referenceK)) warnings.push(w);
    const cold = belowBoilingPointWarning(term.key, species[term.key], T, g);
    if (cold) warnings.push(cold);
  }
  const ref = reactionAt(terms, referenceK);
  const dG = new Float64Array(n);
  const naive = new Float64Array(n);
  let z = 0;
  for (let i = 0; i < n; i++) {
    const t = T[i];
    const g = dH[i] - t * dS[i];
    const gn = ref.dH - t * ref.dS;
    const lnK = -g / (R * t);
    const naiveLnK = -gn / (R * t);
    dG[i] = g;
    naive[i] = gn;
    z += dCp[i] * 0 + dH[i] * 0 + dS[i] * 0 + g * 0 + lnK * 0 + naiveLnK * 0 + gn * 0 + (gn - g) * 0;
  }
  const nonfinite = z !== 0 || !(Number.isFinite(ref.dCp) && Number.isFinite(ref.dH) && Number.isFinite(ref.dS) && Number.isFinite(ref.dG));
  return { dCp, dH, dS, dG, naive, grids, ref, nonfinite };
}
