"use client";

import { Area, CartesianGrid, ComposedChart, Line, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { CHART_MARGIN, ChartLegend, xAxisProps, yAxisProps } from "./chart-parts";
import { CHART_COLORS } from "./colors";

export type CompositionSeries = {
  key: string;
  name: string;
  color: string;
  dashed?: boolean;
  /** Key of a [lo, hi] column drawn as a shaded band behind the line. */
  bandKey?: string;
};

/**
 * Lines (and optional ±σ bands) against temperature. Rows are prepared by the caller; the
 * chart computes nothing.
 */
export function CompositionChart({
  data,
  series,
  yLabel,
  height = 280,
  testId,
  ariaLabel,
  percent = true,
  xKey = "tK",
  xLabel = "T (K)",
  xTicks,
}: {
  data: Record<string, number | [number, number] | null>[];
  series: CompositionSeries[];
  yLabel: string;
  height?: number;
  testId?: string;
  ariaLabel: string;
  /** Values are fractions shown as %. */
  percent?: boolean;
  /** The row field on the x axis and its label; the caller converts temperatures to the display unit. */
  xKey?: string;
  xLabel?: string;
  xTicks?: number[];
}) {
  const fmt = (v: number) => (percent ? `${Number((100 * v).toPrecision(3))} %` : String(Number(v.toPrecision(4))));
  return (
    <figure className="w-full break-inside-avoid" data-testid={testId} aria-label={ariaLabel} role="img">
      <ChartLegend items={series.map((s) => ({ key: s.key, name: `${s.name}${s.bandKey ? " ±1σ" : ""}`, color: s.color, swatch: "line", dashed: s.dashed }))} />
      <div style={{ height }} className="w-full">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} margin={CHART_MARGIN}>
            <CartesianGrid stroke={CHART_COLORS.line} strokeDasharray="2 4" />
            <XAxis {...xAxisProps({ dataKey: xKey, label: xLabel, ticks: xTicks })} />
            <YAxis {...yAxisProps({ label: yLabel, tickFormatter: fmt })} />
            {series
              .filter((s) => s.bandKey)
              .map((s) => (
                <Area
                  key={`band-${s.key}`}
                  dataKey={s.bandKey!}
                  name={`${s.name} ±1σ`}
                  stroke="none"
                  fill={s.color}
                  fillOpacity={0.16}
                  isAnimationActive={false}
                  legendType="none"
                />
              ))}
            {series.map((s) => (
              <Line
                key={s.key}
                dataKey={s.key}
                name={s.name}
                stroke={s.color}
                strokeWidth={2}
                strokeDasharray={s.dashed ? "6 4" : undefined}
                dot={data.length <= 12 ? { r: 2 } : false}
                isAnimationActive={false}
                type="linear"
              />
            ))}
            <Tooltip
              formatter={(value: unknown) => (Array.isArray(value) ? value.map((v) => fmt(Number(v))).join(" … ") : fmt(Number(value)))}
              labelFormatter={(v: unknown) => `T = ${Number(v)} K`}
              contentStyle={{ fontSize: 12 }}
            />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
