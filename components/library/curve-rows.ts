/**
 * Curves from the service → rows and marks for the chart wrappers (which compute nothing).
 * Pure; used by server pages and by the editor's preview.
 */
import type { MarkX, Stretch } from "@/components/charts/line-series-chart";

export type CurveLike = {
  points: { tK: number; cpJ: number; hkJ: number; sJ: number; phase: string; extrapolated: boolean }[];
  chains: { phase: string; tminK: number; tmaxK: number }[];
};

/**
 * The palette (tailwind.config.ts) as plain values: constants exported from a "use client"
 * module reach a server component only as references, so server pages take colours from here.
 */
export const COLORS = { ember: "#e0591b", frost: "#1f7a99", flag: "#b42323", moss: "#2f7a3b", ink: "#3d4656", muted: "#5f6878" };

export const PHASE_LABELS: Record<string, string> = { cr: "solid", l: "liquid", g: "gas" };
export const phaseLabel = (p: string) => PHASE_LABELS[p] ?? (p.startsWith("cr-") ? `solid ${p.slice(3)}` : p);

/** Rows keyed by tK: cp, h, s of A (and of B with their difference A − B when B is on the same grid). */
export function curveRows(a: CurveLike, b?: CurveLike): Record<string, number | null>[] {
  return a.points.map((p, i) => {
    const q = b?.points[i];
    const row: Record<string, number | null> = { tK: p.tK, cp: p.cpJ, h: p.hkJ, s: p.sJ };
    if (q && Math.abs(q.tK - p.tK) < 1e-9) {
      Object.assign(row, { cpB: q.cpJ, hB: q.hkJ, sB: q.sJ, dCp: p.cpJ - q.cpJ, dH: p.hkJ - q.hkJ, dS: p.sJ - q.sJ });
    }
    return row;
  });
}

/** Contiguous runs of extrapolated points, as shaded stretches. */
export function extrapolatedStretches(c: CurveLike): Stretch[] {
  const out: Stretch[] = [];
  let start: number | null = null;
  let prev = 0;
  for (const p of c.points) {
    if (p.extrapolated && start === null) start = p.tK;
    if (!p.extrapolated && start !== null) {
      out.push({ x1: start, x2: p.tK });
      start = null;
    }
    prev = p.tK;
  }
  if (start !== null) out.push({ x1: start, x2: prev });
  return out.filter((s) => s.x2 > s.x1);
}

/** Validity edges of each phase's chain inside the plotted span. */
export function validityMarks(c: CurveLike, color: string): MarkX[] {
  const lo = c.points[0]?.tK ?? 0;
  const hi = c.points[c.points.length - 1]?.tK ?? 0;
  const marks: MarkX[] = [];
  for (const ch of c.chains) {
    if (ch.tminK > lo && ch.tminK < hi) marks.push({ x: ch.tminK, label: `${ch.tminK} K`, color, dashed: true });
    if (ch.tmaxK > lo && ch.tmaxK < hi) marks.push({ x: ch.tmaxK, label: `${ch.tmaxK} K`, color, dashed: true });
  }
  return marks;
}
