import type { Key, ReactNode } from "react";

/**
 * The app's tables, one component driven by a column list.
 *
 * Looks:
 * - `list`: records on a page (cases, datasets, audit, invitations, segments) — text-sm, muted
 *   small headers, a rule between rows.
 * - `numbers`: engine numbers (summary, equilibrium, fugacity, sources, contributions, impact) —
 *   text-xs, a rule under the headers, right-aligned tabular figures.
 * - `compact`: small right-aligned lists of numbers with muted headers (snapshot diff, stored points).
 * - `grid`: a long scrolling table whose header (and first column, when a column is `sticky`) stays
 *   in view: results' numbers, the CSV preview.
 */
export type TableLook = "list" | "numbers" | "compact" | "grid";

export type Column<Row> = {
  /** Unique within the table (React key). */
  key: string;
  header: ReactNode;
  cell: (row: Row, index: number) => ReactNode;
  /** Default: the table's `align`. */
  align?: "left" | "right";
  /** Stays in view when the table scrolls sideways (`grid`, first column). */
  sticky?: boolean;
  /** Extra classes on the column's cells, fixed or per row. */
  className?: string | ((row: Row, index: number) => string | undefined);
  headerClassName?: string;
  headerTestId?: string;
  cellTestId?: string;
  /** The number behind the cell (full precision, SI) for tests and copy: the cell's data-value. */
  value?: (row: Row, index: number) => number | string | null | undefined;
};

type LookClasses = { table: string; thead: string; th: string; tbody: string; tr: string; td: string; right: string; left: string };

const LOOKS: Record<TableLook, LookClasses> = {
  list: {
    table: "w-full text-sm",
    thead: "text-xs text-ink-muted",
    th: "py-1 pr-3 font-medium last:pr-0",
    tbody: "divide-y divide-ink-line",
    tr: "",
    td: "py-1.5 pr-3 last:pr-0",
    right: "text-right tabular",
    left: "text-left",
  },
  numbers: {
    table: "w-full text-xs",
    thead: "",
    th: "border-b border-ink-line py-1 font-medium",
    tbody: "",
    tr: "",
    td: "py-0.5 tabular",
    right: "text-right",
    left: "text-left",
  },
  compact: {
    table: "w-full text-xs",
    thead: "text-ink-muted",
    th: "py-1 pr-3 font-medium last:pr-0",
    tbody: "tabular",
    tr: "",
    td: "pr-3 last:pr-0",
    right: "text-right",
    left: "text-left",
  },
  grid: {
    table: "w-full border-separate border-spacing-0 text-xs",
    thead: "text-ink-soft",
    th: "sticky top-0 z-10 bg-paper-deep px-2 py-1.5 font-medium",
    tbody: "",
    tr: "[&>td]:border-b [&>td]:border-ink-line/40",
    td: "px-2 py-1 tabular",
    right: "text-right",
    left: "text-left",
  },
};

const STICKY_TH = "left-0 !z-20 border-r border-ink-line/60";
const STICKY_TD = "sticky left-0 z-[5] border-r border-ink-line/60";

const join = (...parts: (string | false | null | undefined)[]) => parts.filter(Boolean).join(" ");

export function DataTable<Row>({
  columns,
  rows,
  rowKey,
  look = "list",
  caption,
  testId,
  className,
  rowClassName,
  rowTestId,
  nowrap = false,
  dense = false,
  rules = false,
  stickyHeader = false,
  alignTop = false,
  align,
  nowrapHeader = false,
}: {
  /** `false` entries are skipped, for columns shown only sometimes. */
  columns: (Column<Row> | false | null | undefined)[];
  rows: readonly Row[];
  rowKey: (row: Row, index: number) => Key;
  look?: TableLook;
  caption?: ReactNode;
  testId?: string;
  /** Extra classes on the table element (width, margins). */
  className?: string;
  rowClassName?: (row: Row, index: number) => string | undefined;
  rowTestId?: string;
  /** Cells never wrap (the table scrolls sideways instead). */
  nowrap?: boolean;
  /** Smaller type and padding, for a printed page. */
  dense?: boolean;
  /** A rule between body rows. */
  rules?: boolean;
  /** Cells start at the top of a row (rows with several lines). */
  alignTop?: boolean;
  /** Every column's alignment unless it says otherwise; default: right in every look but `list`. */
  align?: "left" | "right";
  /** Header cells never wrap. */
  nowrapHeader?: boolean;
  /** The header row stays in view when a scrolling parent scrolls (always so in `grid`). */
  stickyHeader?: boolean;
}) {
  const l = LOOKS[look];
  const cols = columns.filter((c): c is Column<Row> => Boolean(c));
  const pad = look === "numbers" ? (dense ? "px-1" : "px-2") : "";
  const alignOf = (c: Column<Row>) => ((c.align ?? align ?? (look === "list" ? "left" : "right")) === "right" ? l.right : l.left);
  return (
    <table className={join(l.table, dense && "!text-[10px]", className)} data-testid={testId}>
      {caption && <caption className="mb-2 text-left text-xs font-semibold uppercase tracking-wide text-ink-muted">{caption}</caption>}
      <thead className={join(l.thead, stickyHeader && "sticky top-0 bg-white") || undefined}>
        <tr>
          {cols.map((c) => (
            <th
              key={c.key}
              className={join(l.th, pad, alignOf(c), (nowrap || nowrapHeader) && "whitespace-nowrap", c.sticky && STICKY_TH, c.headerClassName)}
              data-testid={c.headerTestId}
            >
              {c.header}
            </th>
          ))}
        </tr>
      </thead>
      <tbody className={join(l.tbody, rules && "divide-y divide-ink-line", alignTop && "align-top") || undefined}>
        {rows.map((row, i) => (
          <tr key={rowKey(row, i)} className={join(l.tr, rowClassName?.(row, i)) || undefined} data-testid={rowTestId}>
            {cols.map((c) => {
              const value = c.value?.(row, i);
              return (
                <td
                  key={c.key}
                  className={join(
                    l.td,
                    pad,
                    alignOf(c),
                    nowrap && "whitespace-nowrap",
                    c.sticky && STICKY_TD,
                    typeof c.className === "function" ? c.className(row, i) : c.className,
                  )}
                  data-testid={c.cellTestId}
                  data-value={c.value ? (value ?? "") : undefined}
                >
                  {c.cell(row, i)}
                </td>
              );
            })}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
