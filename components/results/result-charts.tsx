"use client";

import { CHART_COLORS, LineSeriesChart } from "@/components/charts/line-series-chart";
import { UNIT_LABELS, type DisplayUnit } from "@/lib/cases/display-unit";
import type { EvaluateResult } from "@/lib/thermo/evaluate";
import { useChartSeries } from "./series";

/** The tolerance in words, as the legend states it. */
export function toleranceWords(toleranceKJ: number, toleranceKFactor?: number | null): string {
  return `|naive − corrected| > ${toleranceKJ} kJ/mol${toleranceKFactor ? ` or K off by more than ×${toleranceKFactor}` : ""}`;
}

/** The result's charts: ΔrG corrected vs naive, their difference, K, ln K vs 1/T, ΔrH and ΔrS, against T in the display unit. */
export function ResultCharts({
  result,
  totalPoints,
  toleranceKJ,
  toleranceKFactor = null,
  unit = "K",
  compact = false,
}: {
  result: EvaluateResult;
  /** How many temperatures the case has when `result.points` is already a drawing sample (the route's `points`). */
  totalPoints?: number;
  toleranceKJ: number;
  toleranceKFactor?: number | null;
  unit?: DisplayUnit;
  compact?: boolean;
}) {
  const s = useChartSeries(result, unit, toleranceKJ);
  if (!s) return null;
  const total = Math.max(totalPoints ?? 0, s.total);
  const h = compact ? 210 : 280;
  const panel = "rounded-lg border border-ink-line bg-white p-3 break-inside-avoid print:border-ink-line";
  const title = "mb-1 text-sm font-semibold text-ink";
  const tLabel = `T (${UNIT_LABELS[unit]})`;
  const axis = { xKey: "t", xLabel: tLabel, xTicks: s.ticks, xDomain: s.domain };
  const over = `beyond tolerance (${toleranceWords(toleranceKJ, toleranceKFactor)})`;
  return (
    <div className="space-y-4" data-testid="result-charts" data-unit={unit}>
      {s.drawn < total && (
        <p className="text-xs text-ink-muted" data-testid="downsample-note">
          Charts draw {s.drawn.toLocaleString("en")} of {total.toLocaleString("en")} points (extremes kept); the table and the CSV carry every point.
        </p>
      )}
      <section className={panel}>
        <h3 className={title}>ΔrG(T): corrected against naive</h3>
        <p className="mb-2 text-xs text-ink-muted">
          Solid ember: integrated heat capacities. Dashed frost: ΔrH(Tref) − T·ΔrS(Tref). Shaded between them: the difference, red where it is beyond tolerance
          {s.anyOver ? (s.anyWithin ? "" : " (everywhere in this span)") : " (nowhere in this span)"}.
        </p>
        <LineSeriesChart
          testId="chart-dg"
          ariaLabel="Reaction Gibbs energy against temperature, corrected and naive"
          data={s.dG}
          {...axis}
          yLabel="ΔrG (kJ/mol)"
          bands={[
            ...(s.anyWithin ? [{ key: "band", name: "difference within tolerance", color: CHART_COLORS.ember, opacity: 0.18 }] : []),
            ...(s.anyOver ? [{ key: "bandOver", name: over, color: CHART_COLORS.flag, opacity: 0.3 }] : []),
          ]}
          series={[
            { key: "corrected", name: "corrected", color: CHART_COLORS.ember, width: 2.5 },
            { key: "naive", name: "naive", color: CHART_COLORS.frost, dashed: true },
          ]}
          marksX={s.marks}
          marksY={[{ y: 0, color: CHART_COLORS.muted }]}
          height={compact ? 260 : 340}
        />
      </section>
      <div className="grid gap-4 md:grid-cols-2 print:grid-cols-2">
        <section className={panel}>
          <h3 className={title}>Naive − corrected</h3>
          <LineSeriesChart
            testId="chart-diff"
            ariaLabel="Difference between naive and corrected reaction Gibbs energy"
            data={s.diff}
            {...axis}
            yLabel="difference (kJ/mol)"
            series={[{ key: "diff", name: "naive − corrected", color: CHART_COLORS.ink }]}
            bands={s.anyOver ? [{ key: "over", name: "beyond tolerance", color: CHART_COLORS.flag, opacity: 0.25 }] : []}
            legendExtra={[{ name: `tolerance ±${toleranceKJ} kJ/mol`, color: CHART_COLORS.flag, line: "dashed" }]}
            marksY={[
              { y: toleranceKJ, color: CHART_COLORS.flag, dashed: true },
              { y: -toleranceKJ, color: CHART_COLORS.flag, dashed: true },
            ]}
            height={h}
          />
        </section>
        <section className={panel}>
          <h3 className={title}>K(T), log scale</h3>
          <p className="mb-1 text-xs text-ink-muted">Grey line: K = 1.</p>
          <LineSeriesChart
            testId="chart-k"
            ariaLabel="Equilibrium constant against temperature on a log axis"
            data={s.logK}
            {...axis}
            yLabel="K (log scale)"
            yTicks="power10"
            series={[
              { key: "log10K", name: "corrected", color: CHART_COLORS.ember },
              { key: "naiveLog10K", name: "naive", color: CHART_COLORS.frost, dashed: true },
            ]}
            marksY={[{ y: 0, color: CHART_COLORS.muted }]}
            height={h}
          />
        </section>
        <section className={panel}>
          <h3 className={title}>ln K against 1/T</h3>
          <p className="mb-1 text-xs text-ink-muted">1/T is taken in kelvin whatever the display unit.</p>
          <LineSeriesChart
            testId="chart-vant-hoff"
            ariaLabel="Natural log of K against inverse temperature"
            data={s.vantHoff}
            xKey="invT"
            xLabel="1000 / T (1/K)"
            xTicks={s.invTicks}
            xDomain={s.invDomain}
            yLabel="ln K"
            series={[
              { key: "lnK", name: "corrected", color: CHART_COLORS.ember },
              { key: "naiveLnK", name: "naive (a straight line)", color: CHART_COLORS.frost, dashed: true },
            ]}
            height={h}
          />
        </section>
        <section className={panel}>
          <h3 className={title}>ΔrH(T) and ΔrS(T)</h3>
          <LineSeriesChart
            testId="chart-dh"
            ariaLabel="Reaction enthalpy against temperature"
            data={s.dH}
            {...axis}
            yLabel="ΔrH (kJ/mol)"
            series={[{ key: "dHkJ", name: "ΔrH", color: CHART_COLORS.ember }]}
            height={compact ? 150 : 170}
          />
          <LineSeriesChart
            testId="chart-ds"
            ariaLabel="Reaction entropy against temperature"
            data={s.dS}
            {...axis}
            yLabel="ΔrS (J/(mol·K))"
            series={[{ key: "dSJ", name: "ΔrS", color: CHART_COLORS.moss }]}
            height={compact ? 150 : 170}
          />
        </section>
      </div>
    </div>
  );
}
