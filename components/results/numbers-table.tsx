"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { DataTable, type Column } from "@/components/ui/table";
import { gridValue, UNIT_LABELS, type DisplayUnit } from "@/lib/cases/display-unit";
import { fixed, sci } from "@/lib/cases/format";
import type { EvaluatePoint } from "@/lib/thermo/evaluate";
import { TABLE_PAGE as PAGE, useTablePage, type TablePage } from "./use-case-results";

/** K from ln K when it is finite in double precision (the engine's own rule for `K`). */
const kOf = (lnK: number) => {
  const k = Math.exp(lnK);
  return Number.isFinite(k) && k > 0 ? k : null;
};

type Point = EvaluatePoint;

const rowBg = (p: Point) => (p.exceedsTolerance ? "bg-flag-50" : "bg-white");

const columns = (unit: DisplayUnit): Column<Point>[] => [
  // The T column stays put when the table scrolls sideways, so it carries the row's background.
  {
    key: "t",
    header: `T (${UNIT_LABELS[unit]})`,
    headerTestId: "numbers-t-header",
    sticky: true,
    className: (p) => `${rowBg(p)} font-medium`,
    value: (p) => p.tK,
    cell: (p) => gridValue(p.tK, unit),
  },
  { key: "cp", header: "ΔrCp (J/(mol·K))", value: (p) => p.dCpJ, cell: (p) => fixed(p.dCpJ, 3) },
  { key: "h", header: "ΔrH (kJ/mol)", value: (p) => p.dHkJ, cell: (p) => fixed(p.dHkJ, 3) },
  { key: "s", header: "ΔrS (J/(mol·K))", value: (p) => p.dSJ, cell: (p) => fixed(p.dSJ, 3) },
  { key: "g", header: "ΔrG corrected (kJ/mol)", className: "font-medium text-ember-700", value: (p) => p.dGkJ, cell: (p) => fixed(p.dGkJ, 3) },
  { key: "gn", header: "ΔrG naive (kJ/mol)", className: "text-frost-700", value: (p) => p.naiveDGkJ, cell: (p) => fixed(p.naiveDGkJ, 3) },
  { key: "diff", header: "naive − corrected (kJ/mol)", value: (p) => p.diffKJ, cell: (p) => fixed(p.diffKJ, 3) },
  { key: "lnk", header: "ln K", value: (p) => p.lnK, cell: (p) => fixed(p.lnK, 3) },
  { key: "logk", header: "log10 K", value: (p) => p.log10K, cell: (p) => fixed(p.log10K, 3) },
  { key: "logkn", header: "naive log10 K", className: "text-frost-700", value: (p) => p.naiveLog10K, cell: (p) => fixed(p.naiveLog10K, 3) },
  { key: "k", header: "K", value: (p) => p.K, cell: (p) => sci(p.K, 4) },
  { key: "kn", header: "naive K", className: "text-frost-700", value: (p) => kOf(p.naiveLnK), cell: (p) => sci(kOf(p.naiveLnK), 4) },
  { key: "beyond", header: "beyond tolerance", cell: (p) => (p.exceedsTolerance ? "yes" : "") },
];

/**
 * Every point, paginated, temperatures in the display unit; each cell carries the API's number
 * (kelvin, full precision) in data-value. The first page comes with the case's results; a page
 * turn asks the API for that page only. On screen: energies to 0.001 kJ/mol, ln K and log10 K
 * to 3 decimals, K to 4 significant figures. The header and the T column stay put when the
 * table scrolls (sideways on a phone).
 */
export function NumbersTable({ caseId, revision, firstPage, unit = "K" }: { caseId: number; revision?: number; firstPage: TablePage; unit?: DisplayUnit }) {
  const [page, setPage] = useState(0);
  const later = useTablePage(caseId, revision, page === 0 ? null : page * PAGE);
  const shown = page === 0 ? firstPage : (later.data ?? firstPage);
  const total = firstPage.total;
  const pages = Math.max(1, Math.ceil(total / PAGE));
  const rows = shown.points;
  return (
    <div>
      {later.error && (
        <p role="alert" className="mb-2 text-xs text-flag-700">
          {later.error.message}
        </p>
      )}
      <div
        className="max-h-[70vh] overflow-auto rounded-md border border-ink-line/60"
        data-testid="numbers-scroll"
        aria-busy={page > 0 && later.isLoading ? true : undefined}
        tabIndex={0}
        role="region"
        aria-label="Numbers table, scrolls sideways"
      >
        <DataTable look="grid" nowrap testId="numbers-table" columns={columns(unit)} rows={rows} rowKey={(p) => p.tK} rowClassName={rowBg} />
      </div>
      <div className="no-print mt-2 flex items-center justify-between gap-2 text-xs text-ink-muted">
        <span data-testid="table-range">
          Rows {shown.offset + 1}–{Math.min(total, shown.offset + PAGE)} of {total.toLocaleString("en")}
        </span>
        <span className="flex gap-2">
          <Button variant="secondary" className="!px-2 !py-1 text-xs" focusableWhenDisabled disabled={page === 0} onClick={() => setPage(page - 1)}>
            Previous
          </Button>
          <Button variant="secondary" className="!px-2 !py-1 text-xs" focusableWhenDisabled disabled={page >= pages - 1} onClick={() => setPage(page + 1)}>
            Next
          </Button>
        </span>
      </div>
    </div>
  );
}
