/** Chart rows and table rows from an equilibrium result; pure, shared by the panel and the report. */
import type { EvaluateResult } from "@/lib/thermo/evaluate";

/** Every k-th row and the last, for drawing only (the curves are smooth); tables and the CSV keep every point. */
function thin<T>(rows: readonly T[], max: number): T[] {
  if (rows.length <= max) return rows.slice();
  const k = Math.ceil(rows.length / max);
  return rows.filter((_, i) => i % k === 0 || i === rows.length - 1);
}

export const SPECIES_COLORS = ["#e0591b", "#1f7a99", "#2f7a3b", "#7a4fa0", "#b42323", "#3d4656", "#a8741a", "#c2457a"];

export function colorOf(i: number): string {
  return SPECIES_COLORS[i % SPECIES_COLORS.length];
}

/** Gas-phase species in the order of the result. */
export function gasSpecies(result: EvaluateResult): string[] {
  const first = result.equilibrium?.[0];
  return first ? Object.keys(first.moleFractions) : [];
}

/** Rows for the composition chart: x_i corrected and naive per species, at most ~`max` rows. */
export function compositionRows(result: EvaluateResult, max = 400): Record<string, number | [number, number] | null>[] {
  const eq = result.equilibrium ?? [];
  const keys = gasSpecies(result);
  return thin(eq, max).map((p) => {
    const row: Record<string, number | [number, number] | null> = { tK: p.tK };
    for (const k of keys) {
      row[`c:${k}`] = p.moleFractions[k] ?? null;
      row[`n:${k}`] = p.naive.moleFractions[k] ?? null;
    }
    return row;
  });
}

/** Rows for the key-fraction chart, with ±1σ bands where the result carries uncertainties. */
export function keyRows(result: EvaluateResult, max = 400): Record<string, number | [number, number] | null>[] {
  const eq = result.equilibrium ?? [];
  return thin(eq, max).map((p) => {
    const c = p.keyFraction;
    const n = p.naive.keyFraction;
    const sc = p.sigma?.keyFraction;
    const sn = p.naive.sigma?.keyFraction;
    return {
      tK: p.tK,
      corrected: c,
      naive: n,
      correctedBand: c !== null && sc != null ? [Math.max(0, c - sc), c + sc] : null,
      naiveBand: n !== null && sn != null ? [Math.max(0, n - sn), n + sn] : null,
    };
  });
}
