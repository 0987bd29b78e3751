"use client";

import { useMemo } from "react";
import { CHART_COLORS } from "@/components/charts/colors";
import type { MarkX, Stretch } from "@/components/charts/line-series-chart";
import { downsample } from "@/lib/cases/downsample";
import { kelvin } from "@/lib/cases/format";
import type { EvaluateResult } from "@/lib/thermo/evaluate";

/** Points drawn per chart; the table and the CSV always use every point. */
export const DRAW_POINTS = 1200;

/** Contiguous runs of points beyond tolerance, widened to half a step each side so a single point shows. */
export function toleranceStretches(points: EvaluateResult["points"]): Stretch[] {
  const out: Stretch[] = [];
  let start = -1;
  const edge = (i: number, side: -1 | 1) => {
    const j = i + side;
    if (j < 0 || j >= points.length) return points[i].tK;
    return (points[i].tK + points[j].tK) / 2;
  };
  for (let i = 0; i <= points.length; i++) {
    const beyond = i < points.length && points[i].exceedsTolerance;
    if (beyond && start < 0) start = i;
    if (!beyond && start >= 0) {
      out.push({ x1: edge(start, -1), x2: edge(i - 1, 1) });
      start = -1;
    }
  }
  return out;
}

export function useChartSeries(result: EvaluateResult | undefined) {
  return useMemo(() => {
    if (!result) return null;
    const p = result.points;
    const dG = downsample(
      p.map((x) => ({ tK: x.tK, corrected: x.dGkJ, naive: x.naiveDGkJ, band: [Math.min(x.dGkJ, x.naiveDGkJ), Math.max(x.dGkJ, x.naiveDGkJ)] as [number, number] })),
      ["corrected", "naive"],
      DRAW_POINTS,
    );
    const diff = downsample(p.map((x) => ({ tK: x.tK, diff: x.diffKJ })), ["diff"], DRAW_POINTS);
    const logK = downsample(p.map((x) => ({ tK: x.tK, log10K: x.log10K, naiveLog10K: x.naiveLog10K })), ["log10K", "naiveLog10K"], DRAW_POINTS);
    const vantHoff = downsample(
      p.map((x) => ({ invT: 1000 / x.tK, lnK: x.lnK, naiveLnK: x.naiveLnK })).reverse(),
      ["lnK", "naiveLnK"],
      DRAW_POINTS,
    );
    const dH = downsample(p.map((x) => ({ tK: x.tK, dHkJ: x.dHkJ })), ["dHkJ"], DRAW_POINTS);
    const dS = downsample(p.map((x) => ({ tK: x.tK, dSJ: x.dSJ })), ["dSJ"], DRAW_POINTS);
    const marks: MarkX[] = [];
    if (result.crossover.naiveK !== null && result.crossover.naiveInSpan) {
      marks.push({ x: result.crossover.naiveK, label: `naive T* ${kelvin(result.crossover.naiveK)}`, color: CHART_COLORS.frost, dashed: true });
    }
    for (const t of result.crossover.correctedK) marks.push({ x: t, label: `T* ${kelvin(t)}`, color: CHART_COLORS.ember });
    return { dG, diff, logK, vantHoff, dH, dS, marks, stretches: toleranceStretches(p), drawn: dG.length, total: p.length };
  }, [result]);
}
