"use client";

import { Area, CartesianGrid, ComposedChart, Line, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { CHART_COLORS } from "./colors";

export type StackSeries = { key: string; name: string; color: string };
export type StackTotal = { key: string; name: string; color: string };

const plain = (v: number) => (Math.abs(v) >= 1e5 || (Math.abs(v) < 1e-3 && v !== 0) ? v.toExponential(2) : String(Number(v.toPrecision(4))));

/**
 * Stacked areas against temperature, positive parts stacked up from zero and negative parts
 * down (recharts' `sign` offset), with an optional total drawn as a line over them. Rows are
 * prepared by the caller; the chart computes nothing.
 */
export function StackedAreaChart({
  data,
  series,
  total,
  yLabel,
  height = 280,
  testId,
  ariaLabel,
  xKey = "tK",
  xLabel = "T (K)",
  xTicks,
}: {
  data: Record<string, number | null>[];
  series: StackSeries[];
  total?: StackTotal;
  yLabel: string;
  height?: number;
  testId?: string;
  ariaLabel: string;
  /** The row field on the x axis and its label; the caller converts temperatures to the display unit. */
  xKey?: string;
  xLabel?: string;
  xTicks?: number[];
}) {
  return (
    <figure className="w-full break-inside-avoid" data-testid={testId} aria-label={ariaLabel} role="img">
      {/* An HTML legend wraps on a phone, where the chart's own would overlap the plot. */}
      <ul className="mb-1 flex flex-wrap gap-x-3 gap-y-1 text-xs text-ink-soft" aria-hidden="true">
        {series.map((s) => (
          <li key={s.key} className="inline-flex items-center gap-1">
            <svg width="12" height="10" className="shrink-0">
              <rect x="0" y="0" width="12" height="10" fill={s.color} fillOpacity="0.55" stroke={s.color} />
            </svg>
            {s.name}
          </li>
        ))}
        {total && (
          <li className="inline-flex items-center gap-1">
            <svg width="18" height="8" className="shrink-0">
              <line x1="0" y1="4" x2="18" y2="4" stroke={total.color} strokeWidth="2" />
            </svg>
            {total.name}
          </li>
        )}
      </ul>
      <div style={{ height }} className="w-full">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} stackOffset="sign" margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
            <CartesianGrid stroke={CHART_COLORS.line} strokeDasharray="2 4" />
            <XAxis
              dataKey={xKey}
              type="number"
              domain={["dataMin", "dataMax"]}
              ticks={xTicks}
              tickFormatter={plain}
              tick={{ fontSize: 11, fill: CHART_COLORS.muted }}
              label={{ value: xLabel, position: "insideBottom", offset: -14, fontSize: 11, fill: CHART_COLORS.ink }}
            />
            <YAxis
              width={64}
              tickFormatter={plain}
              tick={{ fontSize: 11, fill: CHART_COLORS.muted }}
              label={{ value: yLabel, angle: -90, position: "insideLeft", offset: 4, fontSize: 11, fill: CHART_COLORS.ink, style: { textAnchor: "middle" } }}
              domain={["auto", "auto"]}
            />
            <ReferenceLine y={0} stroke={CHART_COLORS.muted} />
            {series.map((s) => (
              <Area
                key={s.key}
                dataKey={s.key}
                name={s.name}
                stackId="stack"
                type="linear"
                stroke={s.color}
                strokeWidth={1}
                fill={s.color}
                fillOpacity={0.55}
                isAnimationActive={false}
              />
            ))}
            {total && <Line dataKey={total.key} name={total.name} stroke={total.color} strokeWidth={2} dot={false} isAnimationActive={false} type="linear" />}
            <Tooltip formatter={(value: unknown) => plain(Number(value))} labelFormatter={(v: unknown) => `T = ${plain(Number(v))} K`} contentStyle={{ fontSize: 12 }} />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
