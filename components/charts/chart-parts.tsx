import type { XAxisProps, YAxisProps } from "recharts";
import { CHART_COLORS } from "./colors";

/**
 * What the charts share: the HTML legend above the plot (it wraps on a phone, where recharts' own
 * would overlap the plot), the margins, and the look of the two axes.
 */

export const CHART_MARGIN = { top: 8, right: 16, bottom: 24, left: 8 };
export const Y_AXIS_WIDTH = 64;

const TICK = { fontSize: 11, fill: CHART_COLORS.muted };

/** Props of a numeric x axis over the rows' `dataKey`, labelled under the plot. */
export function xAxisProps({
  dataKey,
  label,
  ticks,
  domain,
  tickFormatter,
}: {
  dataKey: string;
  label: string;
  ticks?: number[];
  domain?: XAxisProps["domain"];
  tickFormatter?: (v: number) => string;
}): XAxisProps {
  return {
    dataKey,
    type: "number",
    domain: domain ?? ["dataMin", "dataMax"],
    ticks,
    tickFormatter,
    tick: TICK,
    label: { value: label, position: "insideBottom", offset: -14, fontSize: 11, fill: CHART_COLORS.ink },
  };
}

/** Props of the y axis, labelled along its left edge. */
export function yAxisProps({ label, tickFormatter, width = Y_AXIS_WIDTH }: { label: string; tickFormatter?: (v: number) => string; width?: number }): YAxisProps {
  return {
    width,
    tickFormatter,
    tick: TICK,
    label: { value: label, angle: -90, position: "insideLeft", offset: 4, fontSize: 11, fill: CHART_COLORS.ink, style: { textAnchor: "middle" } },
    domain: ["auto", "auto"],
  };
}

/** One legend entry: a short line (a series, a dashed limit) or a filled square (an area, band or stretch). */
export type LegendItem =
  | { key: string; name: string; color: string; swatch: "line"; dashed?: boolean; strokeWidth?: number }
  | { key: string; name: string; color: string; swatch: "area"; fillOpacity: number; strokeOpacity?: number };

export function ChartLegend({ items }: { items: LegendItem[] }) {
  return (
    <ul className="mb-1 flex flex-wrap gap-x-3 gap-y-1 text-xs text-ink-soft" data-testid="chart-legend">
      {items.map((item) => (
        <li key={item.key} className="inline-flex items-center gap-1">
          {item.swatch === "line" ? (
            <svg width="18" height="8" className="shrink-0" aria-hidden="true">
              <line x1="0" y1="4" x2="18" y2="4" stroke={item.color} strokeWidth={item.strokeWidth ?? 2} strokeDasharray={item.dashed ? "4 3" : undefined} />
            </svg>
          ) : (
            <svg width="12" height="10" className="shrink-0" aria-hidden="true">
              <rect width="12" height="10" fill={item.color} fillOpacity={item.fillOpacity} stroke={item.color} strokeOpacity={item.strokeOpacity} />
            </svg>
          )}
          {item.name}
        </li>
      ))}
    </ul>
  );
}
