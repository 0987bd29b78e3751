import { LineSeriesChart, type SeriesSpec, type Stretch } from "@/components/charts/line-series-chart";
import { niceTicks } from "@/lib/cases/display-unit";
import { COLORS as CHART_COLORS, curveMarks, curveRows, extrapolatedStretches, phaseLabel, phaseMismatch, type CurveLike } from "./curve-rows";

const fmt = (t: number) => `${Number(t.toFixed(2))} K`;

/**
 * Cp(T), H(T), S(T) of one version, or of two overlaid with their difference. Each model is
 * drawn only over its own range; its extrapolated stretch is shaded in its colour (alone, A's is
 * also drawn dotted). Renders only.
 */
export function PropertyCharts({ a, b, labelA, labelB, stacked = false }: { a: CurveLike; b?: CurveLike; labelA: string; labelB?: string; stacked?: boolean }) {
  // One chart per row: three across left each too narrow to read its range marks.
  const grid = stacked ? "grid gap-4" : "grid gap-6";
  const rows = curveRows(a, b);
  const compared = !!b && rows.some((r) => r.cpB !== undefined);
  const nameB = labelB ?? "B";
  const stretches: Stretch[] = compared
    ? [...extrapolatedStretches(a, CHART_COLORS.ember), ...extrapolatedStretches(b!, CHART_COLORS.frost)]
    : extrapolatedStretches(a, CHART_COLORS.flag);
  const marks = curveMarks(a, compared ? b : undefined);
  const mismatch = compared ? phaseMismatch(a, b!) : [];
  const spec = (key: string): SeriesSpec[] =>
    compared
      ? [
          { key, name: `A: ${labelA}`, color: CHART_COLORS.ember },
          { key: `${key}B`, name: `B: ${nameB}`, color: CHART_COLORS.frost, dashed: true },
        ]
      : [
          { key, name: labelA, color: CHART_COLORS.ember },
          { key: `${key}X`, name: "extrapolated", color: CHART_COLORS.ember, dashed: true, width: 1 },
        ];
  const legendExtra = compared
    ? [
        ...(extrapolatedStretches(a).length ? [{ name: `A extrapolated`, color: CHART_COLORS.ember, opacity: 0.1 }] : []),
        ...(extrapolatedStretches(b!).length ? [{ name: `B extrapolated`, color: CHART_COLORS.frost, opacity: 0.1 }] : []),
      ]
    : stretches.length
      ? [{ name: "outside the model's range", color: CHART_COLORS.flag, opacity: 0.1 }]
      : [];
  const lo = a.points[0]?.tK ?? 0;
  const hi = a.points[a.points.length - 1]?.tK ?? 1;
  const xTicks = niceTicks(lo, hi, 7).filter((t) => t >= lo - 1e-9 && t <= hi + 1e-9);
  const common = { data: rows, xKey: "tK", xLabel: "T (K)", xTicks, xDomain: [lo, hi] as [number, number], stretches, legendExtra, marksX: marks, height: stacked ? 200 : 240 };
  return (
    <div className="space-y-6">
      <div className={grid}>
        <LineSeriesChart {...common} yLabel="Cp (J/(mol·K))" series={spec("cp")} testId="chart-cp" ariaLabel="Heat capacity against temperature" />
        <LineSeriesChart {...common} yLabel="H (kJ/mol)" series={spec("h")} testId="chart-h" ariaLabel="Enthalpy on the formation basis against temperature" />
        <LineSeriesChart {...common} yLabel="S (J/(mol·K))" series={spec("s")} testId="chart-s" ariaLabel="Absolute entropy against temperature" />
      </div>
      {compared && (
        <div>
          <h3 className="mb-2 text-sm font-semibold text-ink">
            Difference, A − B ({labelA} − {nameB}), where both are inside their ranges
          </h3>
          {mismatch.length > 0 && (
            <p className="mb-2 rounded-md border border-flag-600/30 bg-flag-50 px-3 py-2 text-xs text-flag-700" data-testid="phase-mismatch">
              The difference compares different phases {mismatch.map((m) => `from ${fmt(m.x1)} to ${fmt(m.x2)} (A ${phaseLabel(m.phaseA)}, B ${phaseLabel(m.phaseB)})`).join("; ")}:
              there it is a phase change, not a disagreement between the models.
            </p>
          )}
          <div className={grid}>
            {(
              [
                ["dCp", "ΔCp (J/(mol·K))", "chart-dcp", "Difference in heat capacity"],
                ["dH", "ΔH (kJ/mol)", "chart-dh", "Difference in enthalpy"],
                ["dS", "ΔS (J/(mol·K))", "chart-ds", "Difference in entropy"],
              ] as const
            ).map(([key, yLabel, testId, aria]) => (
              <LineSeriesChart
                key={key}
                {...common}
                stretches={mismatch.map((m) => ({ x1: m.x1, x2: m.x2, color: CHART_COLORS.flag }))}
                legendExtra={mismatch.length ? [{ name: "different phases", color: CHART_COLORS.flag, opacity: 0.1 }] : []}
                yLabel={yLabel}
                series={[{ key, name: `${key.replace("d", "Δ")}, A − B`, color: CHART_COLORS.flag }]}
                marksY={[{ y: 0, color: CHART_COLORS.ink }]}
                testId={testId}
                ariaLabel={aria}
              />
            ))}
          </div>
        </div>
      )}
      <p className="text-xs text-ink-muted">
        H is on the formation basis (elements in their reference states have H = 0 at 298.15 K); S is absolute. Each model is drawn over its own stated range only
        {compared ? "; a shaded stretch in a model's colour is where the plot goes beyond it" : "; beyond it the dotted line is an extrapolation, shaded"}. Dashed grey lines mark
        where each phase&apos;s range starts and ends; red lines mark where the stable phase changes.
      </p>
    </div>
  );
}
