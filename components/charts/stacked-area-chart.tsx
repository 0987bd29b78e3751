"use client";

import { Area, CartesianGrid, ComposedChart, Line, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { CHART_MARGIN, ChartLegend, type LegendItem, xAxisProps, yAxisProps } from "./chart-parts";
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
      <ChartLegend
        items={[
          ...series.map((s): LegendItem => ({ key: s.key, name: s.name, color: s.color, swatch: "area", fillOpacity: 0.55 })),
          ...(total ? [{ key: total.key, name: total.name, color: total.color, swatch: "line" } as const] : []),
        ]}
      />
      <div style={{ height }} className="w-full">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} stackOffset="sign" margin={CHART_MARGIN}>
            <CartesianGrid stroke={CHART_COLORS.line} strokeDasharray="2 4" />
            <XAxis {...xAxisProps({ dataKey: xKey, label: xLabel, ticks: xTicks, tickFormatter: plain })} />
            <YAxis {...yAxisProps({ label: yLabel, tickFormatter: plain })} />
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
