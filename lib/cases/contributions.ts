/**
 * Rows for the "which species moves ΔrG" chart and the report's columns, from an evaluate
 * result's `contributions` (and `contributionsSigma`). Pure and client-safe; the chart
 * computes nothing.
 */
import type { EvaluateResult } from "@/lib/thermo/evaluate";
import { downsample } from "./downsample";

export type ContributionRow = Record<string, number> & { tK: number };

export type ContributionSeries = {
  /** Species keys in the order of the result (the reaction's terms). */
  species: string[];
  /** Chart rows: `s0…` one column per species (kJ/mol), `total` = corrected − naive (kJ/mol). Thinned for drawing. */
  rows: ContributionRow[];
  /** The same for the split of the 1σ band (`total` = sigmaDGkJ), when the result has it. */
  sigmaRows: ContributionRow[] | null;
  /** Where |corrected − naive| is largest: each species' share there. */
  worst: { tK: number; totalKJ: number; shares: { key: string; kJ: number }[] } | null;
};

export const columnOf = (i: number) => `s${i}`;

/** Null when the result carries no contributions (a snapshot frozen before they were computed). */
export function contributionSeries(result: EvaluateResult, maxPoints = 1200): ContributionSeries | null {
  const c = result.contributions;
  if (!c) return null;
  const species = Object.keys(c);
  const p = result.points;
  const cols = species.map((_, i) => columnOf(i));
  const build = (table: Record<string, number[]>, total: (i: number) => number) =>
    downsample(
      p.map((x, i) => {
        const row: ContributionRow = { tK: x.tK, total: total(i) } as ContributionRow;
        species.forEach((k, j) => ((row as Record<string, number>)[cols[j]] = table[k][i]));
        return row;
      }),
      [...cols, "total"],
      maxPoints,
    );
  const rows = build(c, (i) => -p[i].diffKJ);
  const s = result.contributionsSigma;
  const sigmaRows = s ? build(s, (i) => p[i].sigmaDGkJ ?? 0) : null;
  let worst: ContributionSeries["worst"] = null;
  if (p.length) {
    let w = 0;
    for (let i = 1; i < p.length; i++) if (Math.abs(p[i].diffKJ) > Math.abs(p[w].diffKJ)) w = i;
    worst = { tK: p[w].tK, totalKJ: -p[w].diffKJ, shares: species.map((k) => ({ key: k, kJ: c[k][w] })).sort((a, b) => Math.abs(b.kJ) - Math.abs(a.kJ)) };
  }
  return { species, rows, sigmaRows, worst };
}
