"use client";

import Link from "next/link";
import { useEffect, useRef } from "react";
import useSWR from "swr";
import useSWRMutation from "swr/mutation";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { DataTable, type Column } from "@/components/ui/table";
import { getJson, sendJson, type ApiError } from "@/lib/api/client";
import type { ImpactDto } from "@/lib/services/impact";

const num = (x: number | null, digits = 3) => (x === null ? "—" : String(Number(x.toPrecision(digits))));
const temps = (ks: number[]) => (ks.length === 0 ? "none" : ks.map((k) => `${Math.round(k)} K`).join(", "));
const SIGN: Record<string, string> = {
  "favourable-always": "K > 1 at all T",
  "favourable-above": "K > 1 above crossover",
  "favourable-below": "K > 1 below crossover",
  "favourable-never": "K > 1 at no T",
};

/**
 * The version page's impact panel: every case of the team pinned to an older version of this
 * model, re-evaluated on this one by a background job; progress while it runs, then the
 * largest changes, crossovers and sign cases before and after, flagged beyond a case's tolerance.
 */
export function ImpactPanel({ versionId, versionStatus, canStart }: { versionId: number; versionStatus: string; canStart: boolean }) {
  const url = `/api/v1/versions/${versionId}/impact`;
  const { data, error, mutate } = useSWR<ImpactDto, ApiError>(url, getJson, {
    revalidateOnFocus: false,
    refreshInterval: (latest) => (latest?.job && (latest.job.status === "queued" || latest.job.status === "running") ? 1000 : 0),
  });
  // Proposing or approving queues a new run: when the refreshed page brings a new status, ask again.
  const status = useRef(versionStatus);
  useEffect(() => {
    if (status.current === versionStatus) return;
    status.current = versionStatus;
    void mutate();
  }, [versionStatus, mutate]);
  // Starting a run answers with the queued job, which becomes the panel's data without another request.
  const run = useSWRMutation<ImpactDto, ApiError, string>(url, (u: string) => sendJson<ImpactDto>("POST", u), { populateCache: true, revalidate: false });
  const busy = run.isMutating;
  const startError = run.error?.message ?? null;
  const job = data?.job ?? null;
  const active = job?.status === "queued" || job?.status === "running";

  const start = () => {
    run.reset(); // a previous refusal goes away while the new request runs
    return run.trigger().catch(() => undefined);
  };

  const flagged = data?.cases.filter((c) => c.exceedsTolerance).length ?? 0;
  return (
    <div className="space-y-3 text-sm" data-testid="impact-panel">
      <p className="text-ink-muted">Every case of your team pinned to an older version of this model, re-evaluated on this version in the background.</p>
      {error && (
        <p role="alert" className="text-flag-700">
          {error.message}
        </p>
      )}
      {startError && (
        <p role="alert" className="text-flag-700">
          {startError}
        </p>
      )}
      <div className="flex flex-wrap items-center gap-2">
        {job === null && data && <span data-testid="impact-none">Not run yet.</span>}
        {job && (
          <Badge tone={job.status === "done" ? "moss" : job.status === "failed" ? "flag" : "frost"}>
            <span data-testid="impact-status">{job.status}</span>
          </Badge>
        )}
        {job && job.status === "done" && (
          <span className="text-xs text-ink-muted">
            {job.total} case{job.total === 1 ? "" : "s"} · {flagged} beyond tolerance · finished {job.finishedAt?.slice(0, 16).replace("T", " ")} UTC (
            {job.trigger === "manual" ? "run by hand" : `after ${job.trigger === "proposed" ? "proposal" : "approval"}`})
          </span>
        )}
        {canStart && !active && (
          <Button type="button" variant="secondary" disabled={busy} onClick={() => void start()} data-testid="impact-run">
            {busy ? "Queuing…" : job ? "Run again" : "Run the impact"}
          </Button>
        )}
      </div>
      {active && job && (
        <div data-testid="impact-progress">
          <progress className="h-2 w-full" max={Math.max(job.total, 1)} value={job.done} aria-label="Impact progress" />
          <p className="text-xs text-ink-muted">{job.status === "queued" ? "Waiting for the background runner…" : `Re-evaluating: ${job.done} of ${job.total} cases`}</p>
        </div>
      )}
      {job?.status === "failed" && <p className="text-flag-700">The run failed: {job.error}</p>}
      {data && data.cases.length > 0 && (
        <div className="overflow-x-auto">
          <DataTable
            look="numbers"
            align="left"
            nowrapHeader
            rules
            testId="impact-table"
            rowTestId="impact-row"
            columns={IMPACT_COLUMNS}
            rows={data.cases}
            rowKey={(c) => c.caseId}
            alignTop
            rowClassName={(c) => (c.exceedsTolerance ? "bg-flag-50" : undefined)}
          />
        </div>
      )}
      {job?.status === "done" && data?.cases.length === 0 && <p data-testid="impact-empty">No case of your team pins an older version of this model.</p>}
    </div>
  );
}

const flagged = (changed: boolean) => (changed ? "font-semibold text-flag-700" : undefined);

const IMPACT_COLUMNS: Column<ImpactDto["cases"][number]>[] = [
  {
    key: "case",
    header: "Case",
    cell: (c) => (
      <>
        <Link href={`/cases/${c.caseId}`} className="text-frost-700 hover:underline">
          {c.title}
        </Link>{" "}
        <span className="text-ink-muted">({c.status})</span>
        {c.exceedsTolerance && (
          <span className="ml-1 font-semibold text-flag-700" data-testid="impact-flag">
            beyond tolerance
          </span>
        )}
        {c.error && <span className="block text-flag-700">{c.error}</span>}
      </>
    ),
  },
  { key: "pins", header: "Pins", cell: (c) => `v${c.pinnedVersionNumbers.join(", v")}` },
  { key: "dg", header: "max |ΔΔrG| (kJ/mol)", cell: (c) => num(c.maxDiffKJ) },
  { key: "logk", header: "max |Δlog10 K|", cell: (c) => num(c.maxDiffLog10K) },
  { key: "x", header: "max |Δ key fraction|", cell: (c) => (c.maxDiffKeyFraction === null ? "—" : `${num(100 * c.maxDiffKeyFraction)} %`) },
  {
    key: "crossovers",
    header: "Crossovers before → after",
    className: (c) => flagged(c.crossoversBefore.length !== c.crossoversAfter.length),
    cell: (c) => `${temps(c.crossoversBefore)} → ${temps(c.crossoversAfter)}`,
  },
  {
    key: "sign",
    header: "Sign case before → after",
    className: (c) => flagged(c.signCaseBefore !== c.signCaseAfter),
    cell: (c) => `${c.signCaseBefore ? SIGN[c.signCaseBefore] : "—"} → ${c.signCaseAfter ? SIGN[c.signCaseAfter] : "—"}`,
  },
];
