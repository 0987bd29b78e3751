"use client";

import { Area, CartesianGrid, ComposedChart, Line, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { CHART_COLORS } from "./line-series-chart";

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
      {/* An HTML legend wraps on a phone, where the chart's own would overlap the plot. */}
      <ul className="mb-1 flex flex-wrap gap-x-3 gap-y-1 text-xs text-ink-soft" aria-hidden="true">
        {series.map((s) => (
          <li key={s.key} className="inline-flex items-center gap-1">
            <svg width="18" height="8" className="shrink-0">
              <line x1="0" y1="4" x2="18" y2="4" stroke={s.color} strokeWidth="2" strokeDasharray={s.dashed ? "4 3" : undefined} />
            </svg>
            {s.name}
            {s.bandKey ? " ±1σ" : ""}
          </li>
        ))}
      </ul>
      <div style={{ height }} className="w-full">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
            <CartesianGrid stroke={CHART_COLORS.line} strokeDasharray="2 4" />
            <XAxis
              dataKey={xKey}
              type="number"
              domain={["dataMin", "dataMax"]}
              ticks={xTicks}
              tick={{ fontSize: 11, fill: CHART_COLORS.muted }}
              label={{ value: xLabel, position: "insideBottom", offset: -14, fontSize: 11, fill: CHART_COLORS.ink }}
            />
            <YAxis
              width={64}
              tickFormatter={fmt}
              tick={{ fontSize: 11, fill: CHART_COLORS.muted }}
              label={{ value: yLabel, angle: -90, position: "insideLeft", offset: 4, fontSize: 11, fill: CHART_COLORS.ink, style: { textAnchor: "middle" } }}
              domain={["auto", "auto"]}
            />
            {series
              .filter((s) => s.bandKey)
              .map((s) => (
                <Area key={`band-${s.key}`} dataKey={s.bandKey!} name={`${s.name} ±1σ`} stroke="none" fill={s.color} fillOpacity={0.16} isAnimationActive={false} legendType="none" />
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
