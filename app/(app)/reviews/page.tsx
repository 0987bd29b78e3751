import Link from "next/link";
import { StatusBadge } from "@/components/cases/status-badge";
import { Card, PageHeader } from "@/components/ui/card";
import { requireUser } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { getActor } from "@/lib/auth/session";
import { listCases } from "@/lib/services/cases";
import { recentDecisions, reviewQueue } from "@/lib/services/reviews";

export const metadata = { title: "Reviews" };

export default async function ReviewsPage() {
  const actor = requireUser(await getActor());
  const reviewer = can(actor.role, "cases.review");
  const queue = reviewer ? await reviewQueue(actor) : [];
  const waitingMine = !reviewer ? await listCases(actor, { status: "submitted", mine: true }) : [];
  const decisions = await recentDecisions(actor, 10);
  return (
    <>
      <PageHeader
        title="Reviews"
        lead={
          reviewer ? "Submitted cases waiting for a decision. Your own cases go to another reviewer." : "Your role does not decide cases; this is where yours wait for a reviewer."
        }
      />
      <div className="grid gap-4 lg:grid-cols-3">
        <Card title={reviewer ? `Waiting for review (${queue.length})` : `Your cases waiting (${waitingMine.length})`} className="lg:col-span-2">
          {(reviewer ? queue : waitingMine).length === 0 ? (
            <p className="text-sm text-ink-muted">Nothing is waiting.</p>
          ) : (
            <ul className="divide-y divide-ink-line/60" data-testid="review-queue">
              {(reviewer ? queue : waitingMine).map((c) => (
                <li key={c.id} className="flex flex-wrap items-baseline justify-between gap-2 py-2">
                  <div>
                    <Link href={`/cases/${c.id}`} className="font-medium underline decoration-ink-line underline-offset-2">
                      {c.title}
                    </Link>
                    <p className="text-xs text-ink-muted">
                      {c.reaction} · {c.span}
                    </p>
                  </div>
                  <div className="text-right text-xs text-ink-muted">
                    <StatusBadge status={c.status} /> r{c.latestRevision} · {c.authorName}
                  </div>
                </li>
              ))}
            </ul>
          )}
        </Card>
        <Card title={`Recent decisions (${decisions.count30d} in 30 days)`}>
          {decisions.items.length === 0 ? (
            <p className="text-sm text-ink-muted">No decisions yet.</p>
          ) : (
            <ul className="space-y-2 text-sm">
              {decisions.items.map((d) => (
                <li key={d.id}>
                  <Link href={`/cases/${d.caseId}`} className="font-medium underline decoration-ink-line underline-offset-2">
                    {d.caseTitle}
                  </Link>{" "}
                  <span className={d.decision === "approved" ? "text-moss-700" : "text-flag-700"}>{d.decision}</span>
                  <span className="block text-xs text-ink-muted">
                    r{d.revision} · {d.reviewerName} · {d.at.slice(0, 10)}
                    {d.reason ? ` · ${d.reason}` : ""}
                  </span>
                </li>
              ))}
            </ul>
          )}
        </Card>
      </div>
    </>
  );
}
