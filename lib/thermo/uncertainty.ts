/**
 * Linear propagation of per-species standard uncertainties (1σ, taken as independent between
 * species and between ΔfH°, S° and Cp) to G(T), ΔrG(T), log10 K and the outlet composition.
 *
 * A species' G(T) = H(T) − T·S(T) moves with
 *   δH°   → δG = δH               (the anchor's enthalpy, carried to every T)
 *   δS°   → δG = −T·δS
 *   δCp/Cp = ε → δG = ε·[(H(T) − H(Tref)) − T·(S(T) − S(Tref))]  (Cp scaled by 1 + ε from Tref)
 * The naive line uses H and S at Tref only, so only the first two reach it.
 */
import { refuse } from "./errors";
import type { ParsedSpecies } from "./schema";
import { parseMolarEnergyKJ, parseMolarEntropyJ } from "./units";

export interface SpeciesUncertainty {
  /** 1σ of ΔfH°, kJ/mol. */
  dfHkJ: number;
  /** 1σ of S°, J/(mol·K). */
  sJ: number;
  /** 1σ of Cp, as a fraction of Cp. */
  cpRelative: number;
}

/** The species entry's `uncertainty`, parsed (units allowed), or null when absent or all zero. */
export function parseUncertainty(key: string, entry: ParsedSpecies): SpeciesUncertainty | null {
  const u = entry.uncertainty;
  if (!u) return null;
  const field = `species[${JSON.stringify(key)}].uncertainty`;
  const dfHkJ = u.dfHkJ === undefined ? 0 : parseMolarEnergyKJ(u.dfHkJ, `${field}.dfHkJ`);
  const sJ = u.sJ === undefined ? 0 : parseMolarEntropyJ(u.sJ, `${field}.sJ`);
  const cpRelative = u.cpRelative ?? 0;
  for (const [name, v] of [
    ["dfHkJ", dfHkJ],
    ["sJ", sJ],
  ] as const) {
    if (v < 0) refuse("invalid-uncertainty", `${field}.${name}: an uncertainty must not be negative (got ${v})`, { species: key });
  }
  if (dfHkJ === 0 && sJ === 0 && cpRelative === 0) return null;
  return { dfHkJ, sJ, cpRelative };
}

/**
 * 1σ of G(T) in J/mol. hJ, sJ at T; hRefJ, sRefJ at the reference temperature (same species).
 */
export function sigmaG(u: SpeciesUncertainty, T: number, hJ: number, sJ: number, hRefJ: number, sRefJ: number): number {
  const h = 1000 * u.dfHkJ;
  const s = T * u.sJ;
  const c = u.cpRelative * (hJ - hRefJ - T * (sJ - sRefJ));
  return Math.sqrt(h * h + s * s + c * c);
}

/** 1σ of the naive G(T) = H(Tref) − T·S(Tref), J/mol. */
export function sigmaGNaive(u: SpeciesUncertainty, T: number): number {
  const h = 1000 * u.dfHkJ;
  const s = T * u.sJ;
  return Math.sqrt(h * h + s * s);
}

/** σ of Σ_i c_i·X_i for independent X_i with σ_i. */
export function combine(coeffs: ArrayLike<number>, sigmas: ArrayLike<number>): number {
  let v = 0;
  for (let i = 0; i < coeffs.length; i++) v += (coeffs[i] * sigmas[i]) ** 2;
  return Math.sqrt(v);
}
