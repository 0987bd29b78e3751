"use client";

import {
  Area,
  CartesianGrid,
  ComposedChart,
  Legend,
  Line,
  ReferenceArea,
  ReferenceLine,
  ResponsiveContainer,
  Tooltip,
  XAxis,
  YAxis,
} from "recharts";

/** Colours of the palette (tailwind.config.ts): ember = corrected, frost = naive, flag = beyond tolerance. */
import { CHART_COLORS } from "./colors";

export { CHART_COLORS };

export type SeriesSpec = { key: string; name: string; color: string; dashed?: boolean; width?: number };
export type BandSpec = { key: string; name: string; color: string };
export type MarkX = { x: number; label: string; color: string; dashed?: boolean };
export type MarkY = { y: number; label?: string; color: string; dashed?: boolean };
export type Stretch = { x1: number; x2: number };

export type LineSeriesChartProps = {
  /** Rows already prepared (and thinned) for drawing; the chart computes nothing. */
  data: Record<string, number | [number, number] | null>[];
  xKey: string;
  xLabel: string;
  yLabel: string;
  series: SeriesSpec[];
  band?: BandSpec;
  marksX?: MarkX[];
  marksY?: MarkY[];
  stretches?: Stretch[];
  stretchLabel?: string;
  /** `power10`: the values are log10 of the quantity and the ticks read 10ⁿ. */
  yTicks?: "number" | "power10";
  height?: number;
  testId?: string;
  ariaLabel: string;
};

const SUPERSCRIPT: Record<string, string> = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹" };
const power10 = (v: number) => (Number.isInteger(v) ? `10${String(v).replace(/./g, (c) => SUPERSCRIPT[c] ?? c)}` : "");
const plain = (v: number) => (Math.abs(v) >= 1e5 || (Math.abs(v) < 1e-3 && v !== 0) ? v.toExponential(1) : String(Number(v.toPrecision(4))));

export function LineSeriesChart({
  data,
  xKey,
  xLabel,
  yLabel,
  series,
  band,
  marksX = [],
  marksY = [],
  stretches = [],
  stretchLabel,
  yTicks = "number",
  height = 260,
  testId,
  ariaLabel,
}: LineSeriesChartProps) {
  const tick = yTicks === "power10" ? power10 : plain;
  return (
    <figure className="w-full break-inside-avoid" data-testid={testId} aria-label={ariaLabel} role="img">
      <div style={{ height }} className="w-full">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
            <CartesianGrid stroke={CHART_COLORS.line} strokeDasharray="2 4" />
            <XAxis
              dataKey={xKey}
              type="number"
              domain={["dataMin", "dataMax"]}
              tickFormatter={plain}
              tick={{ fontSize: 11, fill: CHART_COLORS.muted }}
              label={{ value: xLabel, position: "insideBottom", offset: -14, fontSize: 11, fill: CHART_COLORS.ink }}
            />
            <YAxis
              tickFormatter={tick}
              allowDecimals={yTicks !== "power10"}
              width={64}
              tick={{ fontSize: 11, fill: CHART_COLORS.muted }}
              label={{ value: yLabel, angle: -90, position: "insideLeft", offset: 4, fontSize: 11, fill: CHART_COLORS.ink, style: { textAnchor: "middle" } }}
              domain={["auto", "auto"]}
            />
            {stretches.map((s, i) => (
              <ReferenceArea
                key={`s${i}`}
                x1={s.x1}
                x2={s.x2}
                fill={CHART_COLORS.flag}
                fillOpacity={0.08}
                stroke={CHART_COLORS.flag}
                strokeOpacity={0.35}
                label={i === 0 && stretchLabel ? { value: stretchLabel, position: "insideTop", fontSize: 10, fill: CHART_COLORS.flag } : undefined}
                ifOverflow="extendDomain"
              />
            ))}
            {band && <Area dataKey={band.key} name={band.name} stroke="none" fill={band.color} fillOpacity={0.18} isAnimationActive={false} connectNulls legendType="square" />}
            {marksY.map((m, i) => (
              <ReferenceLine key={`y${i}`} y={m.y} stroke={m.color} strokeDasharray={m.dashed ? "4 4" : undefined} label={m.label ? { value: m.label, position: "insideTopRight", fontSize: 10, fill: m.color } : undefined} />
            ))}
            {marksX.map((m, i) => (
              <ReferenceLine key={`x${i}`} x={m.x} stroke={m.color} strokeDasharray={m.dashed ? "5 4" : undefined} label={{ value: m.label, position: "top", fontSize: 10, fill: m.color }} ifOverflow="hidden" />
            ))}
            {series.map((s) => (
              <Line
                key={s.key}
                dataKey={s.key}
                name={s.name}
                stroke={s.color}
                strokeWidth={s.width ?? 2}
                strokeDasharray={s.dashed ? "6 4" : undefined}
                dot={false}
                isAnimationActive={false}
                connectNulls={false}
                type="linear"
              />
            ))}
            <Tooltip
              formatter={(value: unknown) => (Array.isArray(value) ? value.map((v) => plain(Number(v))).join(" … ") : tick(Number(value)) || plain(Number(value)))}
              labelFormatter={(v: unknown) => `${xLabel.split(" (")[0]} = ${plain(Number(v))}`}
              contentStyle={{ fontSize: 12 }}
            />
            <Legend verticalAlign="top" height={24} wrapperStyle={{ fontSize: 12 }} />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
