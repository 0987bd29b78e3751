"use client";

import { CartesianGrid, ComposedChart, Legend, Line, ReferenceLine, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from "recharts";
import { CHART_COLORS } from "./line-series-chart";

export type XYPoint = { x: number; y: number };

/** Points (scatter) and an optional line over one x axis; the caller prepares every value. */
export function PointsChart({
  points,
  pointsName,
  line,
  lineName,
  xLabel,
  yLabel,
  zeroLine = false,
  height = 240,
  testId,
  ariaLabel,
}: {
  points: XYPoint[];
  pointsName: string;
  line?: XYPoint[];
  lineName?: string;
  xLabel: string;
  yLabel: string;
  zeroLine?: boolean;
  height?: number;
  testId?: string;
  ariaLabel: string;
}) {
  return (
    <figure className="w-full" data-testid={testId} aria-label={ariaLabel} role="img">
      <div style={{ height }} className="w-full">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
            <CartesianGrid stroke={CHART_COLORS.line} strokeDasharray="2 4" />
            <XAxis dataKey="x" type="number" domain={["dataMin", "dataMax"]} tick={{ fontSize: 11, fill: CHART_COLORS.muted }} label={{ value: xLabel, position: "insideBottom", offset: -14, fontSize: 11, fill: CHART_COLORS.ink }} />
            <YAxis dataKey="y" type="number" domain={["auto", "auto"]} width={64} tick={{ fontSize: 11, fill: CHART_COLORS.muted }} tickFormatter={(v: number) => String(Number(v.toPrecision(4)))} label={{ value: yLabel, angle: -90, position: "insideLeft", offset: 4, fontSize: 11, fill: CHART_COLORS.ink, style: { textAnchor: "middle" } }} />
            {zeroLine && <ReferenceLine y={0} stroke={CHART_COLORS.ink} />}
            {line && <Line data={line} dataKey="y" name={lineName} stroke={CHART_COLORS.ember} strokeWidth={2} dot={false} isAnimationActive={false} />}
            <Scatter data={points} dataKey="y" name={pointsName} fill={CHART_COLORS.frost} isAnimationActive={false} />
            <Tooltip contentStyle={{ fontSize: 12 }} formatter={(v: unknown) => String(Number(Number(v).toPrecision(5)))} />
            <Legend verticalAlign="top" height={24} wrapperStyle={{ fontSize: 12 }} />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
