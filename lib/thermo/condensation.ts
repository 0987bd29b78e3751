/**
 * Condensation screening from a species' normal boiling point and triple point (optional
 * fields of its species entry). Two warnings:
 *
 * - `below-boiling-point`: a term is used as a gas at grid temperatures below the species'
 *   normal boiling point (at 1 atm). The pure substance at 1 atm is liquid there (solid below
 *   its triple point), so the ideal-gas chain is a metastable, hypothetical state.
 * - `condensed-phase-possible`: in an equilibrium, a gas species with a boiling point is
 *   present below that boiling point. The criterion is the normal boiling point, a screen:
 *   at a partial pressure of 1 atm or more the species condenses below its normal boiling
 *   point for certain (its dew point is at or above it); below 1 atm the dew point is lower
 *   and the flag may be a false alarm; and above 1 atm it may condense somewhat above the
 *   normal boiling point too, which this screen does not see. Partial pressures under
 *   CONDENSATION_FLOOR_BAR are not flagged.
 */
import { ATM_PA } from "./constants";
import type { EquilibriumInfo, EquilibriumPoint } from "./equilibrium";
import type { ParsedSpecies } from "./schema";
import { fmt, type EngineWarning, type TermGrid } from "./species";
import { parseTemperatureK } from "./units";

const ATM_BAR = ATM_PA / 1e5;
/**
 * Partial pressures below this (bar) are not flagged: a trace far below 1 atm has its dew point
 * far below the normal boiling point (by Clausius–Clapeyron), so the screen would only cry wolf.
 */
export const CONDENSATION_FLOOR_BAR = 1e-6;

export interface PhasePoints {
  boilingPointK?: number;
  triplePointK?: number;
}

/** The entry's boiling and triple points in K (units allowed), checked. */
export function phasePointsOf(key: string, entry: ParsedSpecies): PhasePoints {
  const field = `species[${JSON.stringify(key)}]`;
  const out: PhasePoints = {};
  if (entry.boilingPointK !== undefined) out.boilingPointK = parseTemperatureK(entry.boilingPointK, `${field}.boilingPointK`);
  if (entry.triplePointK !== undefined) out.triplePointK = parseTemperatureK(entry.triplePointK, `${field}.triplePointK`);
  return out;
}

const solidNote = (pp: PhasePoints, tK: number) => (pp.triplePointK !== undefined && tK < pp.triplePointK ? ` (solid below its ${fmt(pp.triplePointK)} K triple point)` : "");

/** `below-boiling-point` for one term: the grid temperatures where its gas chain is used below the normal boiling point. */
export function belowBoilingPointWarning(key: string, entry: ParsedSpecies, T: Float64Array, grid: TermGrid): EngineWarning | null {
  const pp = phasePointsOf(key, entry);
  if (pp.boilingPointK === undefined) return null;
  let first = -1;
  let last = -1;
  for (let i = 0; i < T.length; i++) {
    if (T[i] < pp.boilingPointK && grid.phases[grid.phaseIndex[i]] === "g") {
      if (first < 0) first = i;
      last = i;
    }
  }
  if (first < 0) return null;
  return {
    code: "below-boiling-point",
    species: key,
    tK: T[first],
    toK: T[last],
    boilingPointK: pp.boilingPointK,
    ...(pp.triplePointK !== undefined ? { triplePointK: pp.triplePointK } : {}),
    message: `used as a gas from ${fmt(T[first])} K to ${fmt(T[last])} K, below its normal boiling point of ${fmt(pp.boilingPointK)} K; at 1 atm the pure substance is condensed there${solidNote(pp, T[first])}, and the gas values are those of a hypothetical ideal gas`,
  };
}

/** `condensed-phase-possible` per species of an equilibrium (corrected composition), screened by the normal boiling point. */
export function condensationWarnings(species: Record<string, ParsedSpecies>, points: readonly EquilibriumPoint[], info: EquilibriumInfo): EngineWarning[] {
  const out: EngineWarning[] = [];
  for (const { key } of info.species) {
    const entry = species[key];
    if (!entry) continue;
    const pp = phasePointsOf(key, entry);
    if (pp.boilingPointK === undefined) continue;
    let first = -1;
    let last = -1;
    let maxP = 0;
    for (let i = 0; i < points.length; i++) {
      const y = points[i].moleFractions[key];
      if (y === undefined || !(y * info.pressureBar >= CONDENSATION_FLOOR_BAR) || !(points[i].tK < pp.boilingPointK)) continue;
      if (first < 0) first = i;
      last = i;
      maxP = Math.max(maxP, y * info.pressureBar);
    }
    if (first < 0) continue;
    const certain = maxP >= ATM_BAR;
    out.push({
      code: "condensed-phase-possible",
      species: key,
      tK: points[first].tK,
      toK: points[last].tK,
      boilingPointK: pp.boilingPointK,
      ...(pp.triplePointK !== undefined ? { triplePointK: pp.triplePointK } : {}),
      partialPressureBar: maxP,
      basis: "normal-boiling-point",
      message: `${certain ? "would" : "may"} condense${solidNote(pp, points[first].tK)} from ${fmt(points[first].tK)} K to ${fmt(points[last].tK)} K: below its normal boiling point of ${fmt(pp.boilingPointK)} K at a partial pressure of up to ${fmt(maxP)} bar (${certain ? "at 1 atm or more it condenses below its normal boiling point" : "below 1 atm its dew point is lower, so this is a screen, not a finding"}); the equilibrium treats it as gas`,
    });
  }
  return out;
}
