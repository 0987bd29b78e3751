"use client";

import { useMemo } from "react";
import { CHART_COLORS } from "@/components/charts/colors";
import type { MarkX } from "@/components/charts/line-series-chart";
import { formatTemperature, fromKelvin, niceTicks, type DisplayUnit } from "@/lib/cases/display-unit";
import { downsample } from "@/lib/cases/downsample";
import type { EvaluateResult } from "@/lib/thermo/evaluate";

/** Points drawn per chart; the table and the CSV always use every point. */
export const DRAW_POINTS = 1200;

/**
 * Chart rows in the display unit: x is the temperature in `unit`; the band between the curves is
 * split into the part within tolerance and the part beyond it, so only the stretch that exceeds
 * the tolerance is shaded red (an empty column where it does not).
 */
export function chartSeries(result: EvaluateResult, unit: DisplayUnit, toleranceKJ = 0) {
  const p = result.points;
  const x = (tK: number) => fromKelvin(tK, unit);
  const lo = (a: number, b: number) => Math.min(a, b);
  const hi = (a: number, b: number) => Math.max(a, b);
  const dG = downsample(
    p.map((q) => {
      const band: [number, number] = [lo(q.dGkJ, q.naiveDGkJ), hi(q.dGkJ, q.naiveDGkJ)];
      return { t: x(q.tK), corrected: q.dGkJ, naive: q.naiveDGkJ, band: q.exceedsTolerance ? null : band, bandOver: q.exceedsTolerance ? band : null };
    }),
    ["corrected", "naive"],
    DRAW_POINTS,
  );
  // Beyond tolerance on the difference chart: from the tolerance line out to the curve (from zero when only the K factor is exceeded).
  const beyond = (d: number): [number, number] => (d > toleranceKJ ? [toleranceKJ, d] : d < -toleranceKJ ? [d, -toleranceKJ] : [lo(d, 0), hi(d, 0)]);
  const diff = downsample(
    p.map((q) => ({ t: x(q.tK), diff: q.diffKJ, over: q.exceedsTolerance ? beyond(q.diffKJ) : null })),
    ["diff"],
    DRAW_POINTS,
  );
  const logK = downsample(
    p.map((q) => ({ t: x(q.tK), log10K: q.log10K, naiveLog10K: q.naiveLog10K })),
    ["log10K", "naiveLog10K"],
    DRAW_POINTS,
  );
  const vantHoff = downsample(p.map((q) => ({ invT: 1000 / q.tK, lnK: q.lnK, naiveLnK: q.naiveLnK })).reverse(), ["lnK", "naiveLnK"], DRAW_POINTS);
  const dH = downsample(
    p.map((q) => ({ t: x(q.tK), dHkJ: q.dHkJ })),
    ["dHkJ"],
    DRAW_POINTS,
  );
  const dS = downsample(
    p.map((q) => ({ t: x(q.tK), dSJ: q.dSJ })),
    ["dSJ"],
    DRAW_POINTS,
  );
  const marks: MarkX[] = [];
  if (result.crossover.naiveK !== null && result.crossover.naiveInSpan) {
    marks.push({ x: x(result.crossover.naiveK), label: `naive T* ${formatTemperature(result.crossover.naiveK, unit)}`, color: CHART_COLORS.frost, dashed: true });
  }
  for (const t of result.crossover.correctedK) marks.push({ x: x(t), label: `T* ${formatTemperature(t, unit)}`, color: CHART_COLORS.ember });
  const first = p.length ? x(p[0].tK) : 0;
  const last = p.length ? x(p[p.length - 1].tK) : 1;
  const ticks = niceTicks(first, last, 6).filter((t) => t >= first - 1e-9 && t <= last + 1e-9);
  const invs = vantHoff.map((r) => r.invT);
  const invLo = Math.min(...invs);
  const invHi = Math.max(...invs);
  const invTicks = niceTicks(invLo, invHi, 5).filter((t) => t >= invLo - 1e-9 && t <= invHi + 1e-9);
  const anyOver = p.some((q) => q.exceedsTolerance);
  const anyWithin = p.some((q) => !q.exceedsTolerance);
  return {
    dG,
    diff,
    logK,
    vantHoff,
    dH,
    dS,
    marks,
    ticks,
    domain: [first, last] as [number, number],
    anyOver,
    anyWithin,
    invTicks,
    invDomain: [invLo, invHi] as [number, number],
    drawn: dG.length,
    total: p.length,
  };
}

export function useChartSeries(result: EvaluateResult | undefined, unit: DisplayUnit = "K", toleranceKJ = 0) {
  return useMemo(() => (result ? chartSeries(result, unit, toleranceKJ) : null), [result, unit, toleranceKJ]);
}
