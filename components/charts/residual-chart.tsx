"use client";

import { CartesianGrid, ComposedChart, Legend, Line, ReferenceLine, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from "recharts";
import { CHART_MARGIN, xAxisProps, yAxisProps } from "./chart-parts";
import { CHART_COLORS } from "./colors";

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
          <ComposedChart margin={CHART_MARGIN}>
            <CartesianGrid stroke={CHART_COLORS.line} strokeDasharray="2 4" />
            <XAxis {...xAxisProps({ dataKey: "x", label: xLabel })} />
            <YAxis {...yAxisProps({ label: yLabel, tickFormatter: (v: number) => String(Number(v.toPrecision(4))) })} dataKey="y" type="number" />
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
