"use client";

import dynamic from "next/dynamic";
import Link from "next/link";
import { Badge } from "@/components/ui/badge";
import { buttonClass } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { cautionGasOf } from "@/lib/cases/caution";
import type { DisplayUnit } from "@/lib/cases/display-unit";
import { Caution } from "./caution";
import { NumbersTable } from "./numbers-table";
import { ResultSummary, WarningList } from "./result-summary";
import { useDisplayUnit } from "./display-unit-context";
import { UnitSwitch } from "./unit-switch";
import { useCaseResults } from "./use-case-results";

const ContributionsChart = dynamic(() => import("./contributions-chart").then((m) => m.ContributionsChart), { ssr: false });

/** The chart library is most of this page's JavaScript: the numbers come first, the charts load after them. */
const ResultCharts = dynamic(() => import("./result-charts").then((m) => m.ResultCharts), {
  ssr: false,
  loading: () => <p className="py-8 text-center text-sm text-ink-muted">Drawing the charts…</p>,
});

/**
 * The results of a case, fetched from the API: the stored snapshot once submitted, a live
 * evaluation while a draft. Temperatures read in `initialUnit` (the unit the case was entered
 * in) until the reader switches.
 */
export function ResultsView({ caseId, revision, stamp, initialUnit = "K" }: { caseId: number; revision?: number; stamp: number; initialUnit?: DisplayUnit }) {
  const { unit, setUnit } = useDisplayUnit(initialUnit);
  const q = revision ? `?revision=${revision}` : "";
  const withUnit = (base: string) => (unit === "K" ? base : `${base}${base.includes("?") ? "&" : "?"}unit=${unit}`);
  // One request per view, shared with the equilibrium panel: the drawing sample and the table's first page.
  // The case's lockVersion (stamp): an edit, a submission or a decision asks afresh.
  const { data, error, isLoading } = useCaseResults(caseId, revision, stamp);

  if (isLoading)
    return (
      <Card>
        <p className="text-sm text-ink-muted">Loading the results…</p>
      </Card>
    );
  if (error || !data) {
    return (
      <Card title="Results">
        <div role="alert" className="rounded-md border border-flag-600/30 bg-flag-50 px-3 py-2 text-sm text-flag-700" data-testid="results-error">
          <code className="mr-2 font-semibold">{error?.code ?? "error"}</code>
          {error?.message ?? "The results could not be loaded."}
        </div>
        <Caution className="mt-3" />
      </Card>
    );
  }
  const r = data.result;
  // Peng–Robinson results say so in the caution; every other result keeps the ideal-gas wording.
  const gas = cautionGasOf(r);
  return (
    <div className="space-y-4" data-testid="results">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div className="flex flex-wrap items-center gap-2 text-sm" data-testid="results-source">
          {data.source === "snapshot" ? (
            <>
              <Badge tone="moss">Frozen snapshot · revision {data.revision}</Badge>
              <span className="text-xs text-ink-muted">
                hash{" "}
                <code className="break-all" data-testid="snapshot-hash">
                  {data.hash}
                </code>
              </span>
            </>
          ) : (
            <>
              <Badge tone="frost">Live evaluation</Badge>
              <span className="text-xs text-ink-muted">computed now from the pinned versions; submitting freezes it</span>
            </>
          )}
          <span className="text-xs text-ink-muted">engine {r.engine.version}</span>
        </div>
        <div className="no-print flex flex-wrap items-center gap-2">
          <UnitSwitch unit={unit} onChange={setUnit} />
          <a className={buttonClass("secondary")} href={withUnit(`/api/v1/cases/${caseId}/export${q}`)} download data-testid="csv-export">
            Export CSV
          </a>
          <Link className={buttonClass("secondary")} href={withUnit(`/cases/${caseId}/report${q}`)} data-testid="report-link">
            Printable report
          </Link>
        </div>
      </div>
      <Caution gas={gas} />
      <Card title="What the numbers say">
        <ResultSummary result={r} unit={unit} />
      </Card>
      <ResultCharts result={r} totalPoints={data.sample.total} toleranceKJ={data.inputs.toleranceKJ} toleranceKFactor={data.inputs.toleranceKFactor} unit={unit} />
      <ContributionsChart result={r} unit={unit} />
      <Card title={`Warnings (${r.warnings.length})`}>
        <WarningList warnings={r.warnings} gas={gas} />
      </Card>
      <Card title="Numbers">
        <NumbersTable caseId={caseId} revision={revision} firstPage={data.page} unit={unit} />
      </Card>
      <Caution gas={gas} />
    </div>
  );
}
