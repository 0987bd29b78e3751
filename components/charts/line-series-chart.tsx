"use client";

import { useEffect, useRef, useState } from "react";
import { Area, CartesianGrid, ComposedChart, Line, ReferenceArea, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";

import { CHART_MARGIN, ChartLegend, type LegendItem, xAxisProps, Y_AXIS_WIDTH, yAxisProps } from "./chart-parts";
/** Colours of the palette (tailwind.config.ts): ember = corrected, frost = naive, flag = beyond tolerance. */
import { CHART_COLORS } from "./colors";

export { CHART_COLORS };

export type SeriesSpec = { key: string; name: string; color: string; dashed?: boolean; width?: number };
/** A [lo, hi] column drawn as a filled band; `opacity` of the fill (0.18 by default). */
export type BandSpec = { key: string; name: string; color: string; opacity?: number };
export type MarkX = { x: number; label: string; color: string; dashed?: boolean };
export type MarkY = { y: number; label?: string; color: string; dashed?: boolean };
export type Stretch = { x1: number; x2: number; color?: string };
/** A legend entry for something drawn that is not a series (a shaded stretch, a band). */
export type LegendExtra = { name: string; color: string; opacity?: number; line?: "solid" | "dashed" };

export type LineSeriesChartProps = {
  /** Rows already prepared (and thinned) for drawing; the chart computes nothing. */
  data: Record<string, number | [number, number] | null>[];
  xKey: string;
  xLabel: string;
  yLabel: string;
  series: SeriesSpec[];
  band?: BandSpec;
  bands?: BandSpec[];
  marksX?: MarkX[];
  marksY?: MarkY[];
  stretches?: Stretch[];
  /** Legend words for the shaded stretches (the stretches carry no label of their own). */
  stretchLabel?: string;
  legendExtra?: LegendExtra[];
  /** Tick values of the x axis (round numbers in the display unit); the axis spans them and the data. */
  xTicks?: number[];
  xDomain?: [number, number];
  /** `power10`: the values are log10 of the quantity and the ticks read 10ⁿ. */
  yTicks?: "number" | "power10";
  height?: number;
  testId?: string;
  ariaLabel: string;
};

const SUPERSCRIPT: Record<string, string> = { "-": "⁻", "0": "⁰", "1": "¹", "2": "²", "3": "³", "4": "⁴", "5": "⁵", "6": "⁶", "7": "⁷", "8": "⁸", "9": "⁹" };
const power10 = (v: number) => (Number.isInteger(v) ? `10${String(v).replace(/./g, (c) => SUPERSCRIPT[c] ?? c)}` : "");
const plain = (v: number) => (Math.abs(v) >= 1e5 || (Math.abs(v) < 1e-3 && v !== 0) ? v.toExponential(1) : String(Number(v.toPrecision(4))));

const LABEL_FONT = 10;
// A 10 px label with its white halo is about 18 px tall.
const LABEL_ROW = 18;
/** Width of a label in px at 10 px Inter (about 0.56 em a character), with a little air. */
const labelWidth = (s: string) => s.length * LABEL_FONT * 0.6 + 8;

type Placed = { row: number; anchor: "start" | "end" };

/**
 * Rows and sides for the vertical marks' labels, so none overprints another: a label sits to the
 * right of its line unless it would run off the plot, and drops a row when the row is taken.
 * Labels sit inside the plot, under its top edge, never in the legend (which is HTML above the chart).
 */
export function placeMarkLabels(marks: readonly { x: number; label: string }[], domain: [number, number], plotWidth: number): Placed[] {
  const [lo, hi] = domain;
  const span = hi - lo || 1;
  const order = marks.map((_, i) => i).sort((a, b) => marks[a].x - marks[b].x);
  const rows: [number, number][][] = [];
  const out: Placed[] = new Array(marks.length);
  for (const i of order) {
    const px = ((marks[i].x - lo) / span) * plotWidth;
    const w = labelWidth(marks[i].label);
    const anchor = px + 3 + w > plotWidth ? "end" : "start";
    const ext: [number, number] = anchor === "start" ? [px + 3, px + 3 + w] : [px - 3 - w, px - 3];
    let row = rows.findIndex((r) => r.every(([a, b]) => ext[1] < a || ext[0] > b));
    if (row < 0) row = rows.push([]) - 1;
    rows[row].push(ext);
    out[i] = { row, anchor };
  }
  return out;
}

function MarkLabel({ viewBox, text, color, row, anchor }: { viewBox?: { x?: number; y?: number }; text: string; color: string; row: number; anchor: "start" | "end" }) {
  const x = (viewBox?.x ?? 0) + (anchor === "start" ? 3 : -3);
  const y = (viewBox?.y ?? 0) + LABEL_ROW + row * LABEL_ROW;
  return (
    <text x={x} y={y} textAnchor={anchor} fontSize={LABEL_FONT} fill={color} stroke="#fff" strokeWidth={3} paintOrder="stroke" data-mark-label="">
      {text}
    </text>
  );
}

/** Series as lines, then bands and the extras (filled squares unless they are a line). */
function legendItems(series: SeriesSpec[], bands: BandSpec[], extra: LegendExtra[]): LegendItem[] {
  return [
    ...series.map((s): LegendItem => ({ key: s.key, name: s.name, color: s.color, swatch: "line", dashed: s.dashed })),
    ...[...bands.map((b): LegendExtra => ({ name: b.name, color: b.color, opacity: b.opacity ?? 0.18 })), ...extra].map((e): LegendItem =>
      e.line
        ? { key: e.name, name: e.name, color: e.color, swatch: "line", dashed: e.line === "dashed", strokeWidth: 1.5 }
        : { key: e.name, name: e.name, color: e.color, swatch: "area", fillOpacity: Math.max(0.25, e.opacity ?? 0.25), strokeOpacity: 0.5 },
    ),
  ];
}

export function LineSeriesChart({
  data,
  xKey,
  xLabel,
  yLabel,
  series,
  band,
  bands = [],
  marksX = [],
  marksY = [],
  stretches = [],
  stretchLabel,
  legendExtra = [],
  xTicks,
  xDomain,
  yTicks = "number",
  height = 260,
  testId,
  ariaLabel,
}: LineSeriesChartProps) {
  // The plot's own width, so the marks' labels are placed in pixels (a phone's plot is narrow).
  const box = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(600);
  useEffect(() => {
    const el = box.current;
    if (!el) return;
    setWidth(el.getBoundingClientRect().width || 600);
    const observer = new ResizeObserver(([entry]) => setWidth(entry.contentRect.width));
    observer.observe(el);
    return () => observer.disconnect();
  }, []);
  const tick = yTicks === "power10" ? power10 : plain;
  const allBands = band ? [band, ...bands] : bands;
  const xs = data.map((r) => r[xKey]).filter((v): v is number => typeof v === "number");
  const lo = Math.min(...xs, ...(xTicks ?? []).slice(0, 1));
  const hi = Math.max(...xs, ...(xTicks ?? []).slice(-1));
  const domain: [number, number] = xDomain ?? [lo, hi];
  const plotWidth = Math.max(40, width - CHART_MARGIN.left - CHART_MARGIN.right - Y_AXIS_WIDTH);
  const inside = marksX.filter((m) => m.x >= domain[0] && m.x <= domain[1]);
  const placed = placeMarkLabels(inside, domain, plotWidth);
  const extra = [...(stretchLabel && stretches.length ? [{ name: stretchLabel, color: CHART_COLORS.flag, opacity: 0.1 }] : []), ...legendExtra];
  return (
    <figure className="w-full break-inside-avoid" data-testid={testId} aria-label={ariaLabel} role="img">
      {/* An HTML legend above the plot wraps on a phone; the marks' labels stay inside the plot. */}
      <ChartLegend items={legendItems(series, allBands, extra)} />
      <div style={{ height }} className="w-full" ref={box}>
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} margin={CHART_MARGIN}>
            <CartesianGrid stroke={CHART_COLORS.line} strokeDasharray="2 4" />
            <XAxis {...xAxisProps({ dataKey: xKey, label: xLabel, ticks: xTicks, domain, tickFormatter: plain })} interval={xTicks ? 0 : "preserveEnd"} allowDataOverflow={false} />
            <YAxis {...yAxisProps({ label: yLabel, tickFormatter: tick })} allowDecimals={yTicks !== "power10"} />
            {stretches.map((s, i) => (
              <ReferenceArea
                key={`s${i}`}
                x1={s.x1}
                x2={s.x2}
                fill={s.color ?? CHART_COLORS.flag}
                fillOpacity={0.08}
                stroke={s.color ?? CHART_COLORS.flag}
                strokeOpacity={0.35}
                ifOverflow="hidden"
              />
            ))}
            {allBands.map((b) => (
              <Area
                key={b.key}
                dataKey={b.key}
                name={b.name}
                stroke="none"
                fill={b.color}
                fillOpacity={b.opacity ?? 0.18}
                isAnimationActive={false}
                connectNulls={false}
                legendType="none"
              />
            ))}
            {marksY.map((m, i) => (
              <ReferenceLine
                key={`y${i}`}
                y={m.y}
                stroke={m.color}
                strokeDasharray={m.dashed ? "4 4" : undefined}
                label={m.label ? { value: m.label, position: "insideBottomRight", fontSize: 10, fill: m.color } : undefined}
              />
            ))}
            {inside.map((m, i) => (
              <ReferenceLine
                key={`x${i}`}
                x={m.x}
                stroke={m.color}
                strokeDasharray={m.dashed ? "5 4" : undefined}
                label={<MarkLabel text={m.label} color={m.color} row={placed[i].row} anchor={placed[i].anchor} />}
                ifOverflow="hidden"
              />
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
          </ComposedChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
