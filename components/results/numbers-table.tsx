"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { gridValue, UNIT_LABELS, type DisplayUnit } from "@/lib/cases/display-unit";
import { fixed, sci } from "@/lib/cases/format";
import { TABLE_PAGE as PAGE, useTablePage, type TablePage } from "./use-case-results";

/** K from ln K when it is finite in double precision (the engine's own rule for `K`). */
const kOf = (lnK: number) => {
  const k = Math.exp(lnK);
  return Number.isFinite(k) && k > 0 ? k : null;
};

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
  const th = "sticky top-0 z-10 bg-paper-deep px-2 py-1.5 text-right font-medium whitespace-nowrap";
  const td = "px-2 py-1 text-right tabular whitespace-nowrap";
  const first = "sticky left-0 z-[5] border-r border-ink-line/60";
  return (
    <div>
      {later.error && (
        <p role="alert" className="mb-2 text-xs text-flag-700">
          {later.error.message}
        </p>
      )}
      <div className="max-h-[70vh] overflow-auto rounded-md border border-ink-line/60" data-testid="numbers-scroll" aria-busy={page > 0 && later.isLoading ? true : undefined} tabIndex={0} role="region" aria-label="Numbers table, scrolls sideways">
        <table className="min-w-full border-separate border-spacing-0 text-xs" data-testid="numbers-table">
          <thead className="text-ink-soft">
            <tr>
              <th className={`${th} ${first} !z-20`} data-testid="numbers-t-header">T ({UNIT_LABELS[unit]})</th>
              <th className={th}>ΔrCp (J/(mol·K))</th>
              <th className={th}>ΔrH (kJ/mol)</th>
              <th className={th}>ΔrS (J/(mol·K))</th>
              <th className={th}>ΔrG corrected (kJ/mol)</th>
              <th className={th}>ΔrG naive (kJ/mol)</th>
              <th className={th}>naive − corrected (kJ/mol)</th>
              <th className={th}>ln K</th>
              <th className={th}>log10 K</th>
              <th className={th}>naive log10 K</th>
              <th className={th}>K</th>
              <th className={th}>naive K</th>
              <th className={th}>beyond tolerance</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((p) => {
              const naiveK = kOf(p.naiveLnK);
              const bg = p.exceedsTolerance ? "bg-flag-50" : "bg-white";
              return (
                <tr key={p.tK} className={`${bg} [&>td]:border-b [&>td]:border-ink-line/40`}>
                  <td className={`${td} ${first} ${bg} font-medium`} data-value={p.tK}>{gridValue(p.tK, unit)}</td>
                  <td className={td} data-value={p.dCpJ}>{fixed(p.dCpJ, 3)}</td>
                  <td className={td} data-value={p.dHkJ}>{fixed(p.dHkJ, 3)}</td>
                  <td className={td} data-value={p.dSJ}>{fixed(p.dSJ, 3)}</td>
                  <td className={`${td} font-medium text-ember-700`} data-value={p.dGkJ}>{fixed(p.dGkJ, 3)}</td>
                  <td className={`${td} text-frost-700`} data-value={p.naiveDGkJ}>{fixed(p.naiveDGkJ, 3)}</td>
                  <td className={td} data-value={p.diffKJ}>{fixed(p.diffKJ, 3)}</td>
                  <td className={td} data-value={p.lnK}>{fixed(p.lnK, 3)}</td>
                  <td className={td} data-value={p.log10K}>{fixed(p.log10K, 3)}</td>
                  <td className={`${td} text-frost-700`} data-value={p.naiveLog10K}>{fixed(p.naiveLog10K, 3)}</td>
                  <td className={td} data-value={p.K ?? ""}>{sci(p.K, 4)}</td>
                  <td className={`${td} text-frost-700`} data-value={naiveK ?? ""}>{sci(naiveK, 4)}</td>
                  <td className={td}>{p.exceedsTolerance ? "yes" : ""}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
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
