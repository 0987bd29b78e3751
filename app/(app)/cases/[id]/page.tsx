import Link from "next/link";
import { CaseActions } from "@/components/cases/case-actions";
import { CommentForm } from "@/components/cases/comment-form";
import { InputsCard, PinsCard } from "@/components/cases/inputs-card";
import { ReviewPanel } from "@/components/cases/review-panel";
import { StatusBadge } from "@/components/cases/status-badge";
import { EquilibriumPanel } from "@/components/equilibrium/equilibrium-panel";
import { DisplayUnitProvider } from "@/components/results/display-unit-context";
import { ResultsView } from "@/components/results/results-view";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { getActor } from "@/lib/auth/session";
import { orNotFound, pageId } from "@/lib/pages";
import { termKey } from "@/lib/cases/balance";
import { enteredUnit } from "@/lib/cases/display-unit";
import { getCase, type CaseDto } from "@/lib/services/cases";

export const metadata = { title: "Case" };

type Props = { params: Promise<{ id: string }>; searchParams: Promise<{ revision?: string }> };

async function load(params: Props["params"]): Promise<CaseDto> {
  return orNotFound(getCase(await getActor(), await pageId(params)));
}

const when = (iso: string) => new Date(iso).toISOString().slice(0, 16).replace("T", " ") + " UTC";

export default async function CasePage({ params, searchParams }: Props) {
  const { id } = await params;
  const c = await load(params);
  const sp = await searchParams;
  const latest = c.snapshots[c.snapshots.length - 1] ?? null;
  const chosen = sp.revision && c.snapshots.some((s) => String(s.revision) === sp.revision) ? Number(sp.revision) : undefined;
  const lastDecision = [...c.snapshots].reverse().find((s) => s.decision)?.decision ?? null;
  const latestDecision = latest?.decision ?? null;
  const coefficients = Object.fromEntries(c.inputs.terms.map((t) => [termKey(t), t.coefficient]));
  return (
    <>
      <PageHeader
        title={c.title}
        lead={
          <span className="text-base text-ink-soft" data-testid="case-reaction">
            {c.reaction}
          </span>
        }
        action={
          <div className="flex flex-wrap items-start gap-2">
            {c.can.edit && (
              <Link href={`/cases/${c.id}/edit`} className={buttonClass("secondary")}>
                Edit
              </Link>
            )}
            <CaseActions caseId={c.id} lockVersion={c.lockVersion} canSubmit={c.can.submit} canRerun={c.can.rerun} status={c.status} nextRevision={(latest?.revision ?? 0) + 1} />
          </div>
        }
      />
      <div className="mb-4 flex flex-wrap items-center gap-x-2 gap-y-1 text-sm text-ink-muted" data-testid="status-line">
        <StatusBadge status={c.status} />
        {/* The badge says the state; the decider is named beside it, the author on their own. */}
        {latestDecision && (c.status === "approved" || c.status === "returned") && (
          <span data-testid="decided-by">
            by {latestDecision.reviewerName}, {when(latestDecision.at)}
          </span>
        )}
        <span data-testid="case-author">· Author: {c.authorName}</span>
        {latest && (
          <span>
            · {c.snapshots.length} revision{c.snapshots.length === 1 ? "" : "s"}
          </span>
        )}
        {c.can.review && latest && (
          <a href="#review" className="no-print font-medium text-frost-700 underline">
            Your decision is asked: review panel below the results
          </a>
        )}
      </div>

      {c.status === "returned" && lastDecision && (
        <div role="status" className="mb-4 rounded-md border border-flag-600/30 bg-flag-50 px-4 py-3 text-sm text-flag-700" data-testid="return-reason">
          <strong>Returned by {lastDecision.reviewerName}:</strong> {lastDecision.reason}
        </div>
      )}
      {c.newerVersions.length > 0 && (
        <div role="status" className="mb-4 rounded-md border border-frost-100 bg-frost-50 px-4 py-3 text-sm text-frost-700" data-testid="newer-versions">
          <strong>Newer approved model versions exist</strong> for {c.newerVersions.map((n) => `${n.key} (${n.modelName}: v${n.pinnedNumber} → v${n.newerNumber})`).join(", ")}.{" "}
          {c.can.rerun ? "Re-run the case on them to make a new revision." : c.status === "submitted" ? "The author can re-run once the review is decided." : ""}
        </div>
      )}

      <div className="mb-6 grid gap-4 lg:grid-cols-3">
        <InputsCard inputs={c.inputs} notes={c.notes} />
        <div className="lg:col-span-2">
          <PinsCard pins={c.pins} coefficients={coefficients} />
        </div>
      </div>

      {chosen && chosen !== latest?.revision && (
        <p className="mb-3 rounded-md bg-paper-deep px-3 py-2 text-sm" data-testid="old-revision">
          Showing revision {chosen}, an earlier snapshot.{" "}
          <Link className="underline" href={`/cases/${c.id}`}>
            Back to the current one
          </Link>
          .
        </p>
      )}
      <DisplayUnitProvider initialUnit={enteredUnit(c.inputs.temperatures)}>
        <ResultsView caseId={c.id} revision={chosen} stamp={c.lockVersion} initialUnit={enteredUnit(c.inputs.temperatures)} />

        {c.can.review && latest && (
          <div id="review" className="mt-6 scroll-mt-4">
            <Card title={`Review revision ${latest.revision}`} className="border-frost-500/40">
              <ReviewPanel caseId={c.id} revision={latest.revision} title={c.title} authorName={c.authorName} />
            </Card>
          </div>
        )}
        <div className="mt-6">
          <EquilibriumPanel
            caseId={c.id}
            revision={chosen}
            canEdit={c.can.edit}
            lockVersion={c.lockVersion}
            initial={c.inputs.equilibrium ?? null}
            caseKeys={c.inputs.terms.map(termKey)}
            reactantKeys={c.inputs.terms.filter((t) => t.coefficient < 0).map(termKey)}
          />
        </div>
      </DisplayUnitProvider>

      <div className="mt-6 grid gap-4 lg:grid-cols-2">
        <Card title={`Snapshot history (${c.snapshots.length})`}>
          {c.snapshots.length === 0 ? (
            <p className="text-sm text-ink-muted">No snapshots yet: submitting freezes the first one.</p>
          ) : (
            <ol className="space-y-3 text-sm" data-testid="snapshots">
              {[...c.snapshots].reverse().map((s) => (
                <li key={s.revision} className="border-b border-ink-line/60 pb-2 last:border-0">
                  <div className="flex flex-wrap items-baseline justify-between gap-2">
                    <Link className="font-medium underline" href={`/cases/${c.id}?revision=${s.revision}`}>
                      Revision {s.revision}
                    </Link>
                    <span className="text-xs text-ink-muted">
                      {when(s.createdAt)} · {s.createdByName}
                    </span>
                  </div>
                  <code className="block break-all text-xs text-ink-muted" title={s.hash}>
                    {s.hash}
                  </code>
                  {s.decision ? (
                    <p className={`text-xs ${s.decision.decision === "approved" ? "text-moss-700" : "text-flag-700"}`}>
                      {s.decision.decision === "approved" ? "Approved" : "Returned"} by {s.decision.reviewerName}
                      {s.decision.reason ? `: ${s.decision.reason}` : ""}
                    </p>
                  ) : (
                    <p className="text-xs text-ink-muted">Awaiting decision</p>
                  )}
                  {s.revision > 1 && (
                    <Link className="text-xs underline" href={`/cases/${c.id}/diff?from=${s.revision - 1}&to=${s.revision}`}>
                      Compare with revision {s.revision - 1}
                    </Link>
                  )}
                </li>
              ))}
            </ol>
          )}
        </Card>
        <Card title={`Comments (${c.comments.length})`}>
          <ul className="mb-4 space-y-3 text-sm" data-testid="comments">
            {c.comments.map((m) => (
              <li key={m.id}>
                <p className="text-xs text-ink-muted">
                  {m.authorName} · {when(m.at)}
                  {m.revision ? ` · on revision ${m.revision}` : ""}
                </p>
                <p className="whitespace-pre-wrap">{m.body}</p>
              </li>
            ))}
          </ul>
          {c.can.comment && <CommentForm caseId={c.id} revision={latest?.revision ?? null} />}
        </Card>
      </div>
    </>
  );
}
