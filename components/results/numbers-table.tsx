"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { fixed, sci } from "@/lib/cases/format";
import type { EvaluateResult } from "@/lib/thermo/evaluate";

const PAGE = 50;

/** Every point, paginated; each cell carries the API's number in data-value. */
export function NumbersTable({ points }: { points: EvaluateResult["points"] }) {
  const [page, setPage] = useState(0);
  const pages = Math.max(1, Math.ceil(points.length / PAGE));
  const rows = points.slice(page * PAGE, page * PAGE + PAGE);
  const th = "px-2 py-1.5 text-right font-medium whitespace-nowrap";
  const td = "px-2 py-1 text-right tabular whitespace-nowrap";
  return (
    <div>
      <div className="overflow-x-auto">
        <table className="min-w-full text-xs" data-testid="numbers-table">
          <thead className="bg-paper-deep text-ink-soft">
            <tr>
              <th className={th}>T (K)</th>
              <th className={th}>ΔrCp (J/(mol·K))</th>
              <th className={th}>ΔrH (kJ/mol)</th>
              <th className={th}>ΔrS (J/(mol·K))</th>
              <th className={th}>ΔrG corrected (kJ/mol)</th>
              <th className={th}>ΔrG naive (kJ/mol)</th>
              <th className={th}>naive − corrected (kJ/mol)</th>
              <th className={th}>ln K</th>
              <th className={th}>K</th>
              <th className={th}>beyond tolerance</th>
            </tr>
          </thead>
          <tbody className="divide-y divide-ink-line/60">
            {rows.map((p) => (
              <tr key={p.tK} className={p.exceedsTolerance ? "bg-flag-50/60" : undefined}>
                <td className={td} data-value={p.tK}>{fixed(p.tK, 2)}</td>
                <td className={td} data-value={p.dCpJ}>{fixed(p.dCpJ, 3)}</td>
                <td className={td} data-value={p.dHkJ}>{fixed(p.dHkJ, 3)}</td>
                <td className={td} data-value={p.dSJ}>{fixed(p.dSJ, 3)}</td>
                <td className={`${td} font-medium text-ember-700`} data-value={p.dGkJ}>{fixed(p.dGkJ, 3)}</td>
                <td className={`${td} text-frost-700`} data-value={p.naiveDGkJ}>{fixed(p.naiveDGkJ, 3)}</td>
                <td className={td} data-value={p.diffKJ}>{fixed(p.diffKJ, 3)}</td>
                <td className={td} data-value={p.lnK}>{fixed(p.lnK, 4)}</td>
                <td className={td} data-value={p.K ?? ""}>{sci(p.K, 4)}</td>
                <td className={td}>{p.exceedsTolerance ? "yes" : ""}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="no-print mt-2 flex items-center justify-between gap-2 text-xs text-ink-muted">
        <span data-testid="table-range">
          Rows {page * PAGE + 1}–{Math.min(points.length, (page + 1) * PAGE)} of {points.length.toLocaleString("en")}
        </span>
        <span className="flex gap-2">
          <Button variant="secondary" className="!px-2 !py-1 text-xs" disabled={page === 0} onClick={() => setPage(page - 1)}>
            Previous
          </Button>
          <Button variant="secondary" className="!px-2 !py-1 text-xs" disabled={page >= pages - 1} onClick={() => setPage(page + 1)}>
            Next
          </Button>
        </span>
      </div>
    </div>
  );
}
