import { LineSeriesChart, type SeriesSpec } from "@/components/charts/line-series-chart";
import { COLORS as CHART_COLORS, curveRows, extrapolatedStretches, validityMarks, type CurveLike } from "./curve-rows";

/** Cp(T), H(T), S(T) of one version, or of two overlaid with their difference. Renders only. */
export function PropertyCharts({ a, b, labelA, labelB, stacked = false }: { a: CurveLike; b?: CurveLike; labelA: string; labelB?: string; stacked?: boolean }) {
  // One chart per row: three across left each too narrow to read its range marks.
  const grid = stacked ? "grid gap-4" : "grid gap-6";
  const rows = curveRows(a, b);
  const stretches = extrapolatedStretches(a);
  const marks = validityMarks(a, CHART_COLORS.muted);
  const compared = !!b && rows.some((r) => r.dCp !== undefined);
  const spec = (key: string, keyB: string): SeriesSpec[] =>
    compared ? [{ key, name: labelA, color: CHART_COLORS.ember }, { key: keyB, name: labelB ?? "B", color: CHART_COLORS.frost, dashed: true }] : [{ key, name: labelA, color: CHART_COLORS.ember }];
  const common = { data: rows, xKey: "tK", xLabel: "T (K)", stretches, stretchLabel: "extrapolated", marksX: marks, height: stacked ? 200 : 240 };
  return (
    <div className="space-y-6">
      <div className={grid}>
        <LineSeriesChart {...common} yLabel="Cp (J/(mol·K))" series={spec("cp", "cpB")} testId="chart-cp" ariaLabel="Heat capacity against temperature" />
        <LineSeriesChart {...common} yLabel="H (kJ/mol)" series={spec("h", "hB")} testId="chart-h" ariaLabel="Enthalpy on the formation basis against temperature" />
        <LineSeriesChart {...common} yLabel="S (J/(mol·K))" series={spec("s", "sB")} testId="chart-s" ariaLabel="Absolute entropy against temperature" />
      </div>
      {compared && (
        <div>
          <h3 className="mb-2 text-sm font-semibold text-ink">Difference, {labelA} − {labelB}</h3>
          <div className={grid}>
            <LineSeriesChart {...common} yLabel="ΔCp (J/(mol·K))" series={[{ key: "dCp", name: "ΔCp", color: CHART_COLORS.flag }]} marksY={[{ y: 0, color: CHART_COLORS.ink }]} testId="chart-dcp" ariaLabel="Difference in heat capacity" />
            <LineSeriesChart {...common} yLabel="ΔH (kJ/mol)" series={[{ key: "dH", name: "ΔH", color: CHART_COLORS.flag }]} marksY={[{ y: 0, color: CHART_COLORS.ink }]} testId="chart-dh" ariaLabel="Difference in enthalpy" />
            <LineSeriesChart {...common} yLabel="ΔS (J/(mol·K))" series={[{ key: "dS", name: "ΔS", color: CHART_COLORS.flag }]} marksY={[{ y: 0, color: CHART_COLORS.ink }]} testId="chart-ds" ariaLabel="Difference in entropy" />
          </div>
        </div>
      )}
      <p className="text-xs text-ink-muted">
        H is on the formation basis (elements in their reference states have H = 0 at 298.15 K); S is absolute. Shaded stretches lie outside the model&apos;s stated range
        and are extrapolated; dashed lines mark where each phase&apos;s range starts and ends.
      </p>
    </div>
  );
}
