import Link from "next/link";
import { StatusBadge } from "@/components/cases/status-badge";
import { Badge } from "@/components/ui/badge";
import { Card, PageHeader } from "@/components/ui/card";
import { ROLE_LABELS, can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { homeCounts } from "@/lib/services/reviews";

export default async function HomePage() {
  const actor = requireUser(await getActor());
  const waiting = await homeCounts(actor);
  const link = "font-medium underline decoration-ink-line underline-offset-2 hover:decoration-ink";
  return (
    <>
      <PageHeader
        title={`Good to see you, ${actor.name.split(" ")[0]}`}
        lead="Heatpath integrates each species' heat capacity from its anchor to your temperature, so ΔG, K and crossover temperatures are corrected for temperature (screening estimate), not taken from 298.15 K values."
      />
      <div className="grid gap-4 md:grid-cols-3">
        <Card title="You">
          <dl className="space-y-2 text-sm">
            <div className="flex justify-between gap-2">
              <dt className="text-ink-muted">Signed in as</dt>
              <dd className="font-medium">{actor.email}</dd>
            </div>
            <div className="flex justify-between gap-2">
              <dt className="text-ink-muted">Team</dt>
              <dd className="font-medium" data-testid="home-team">
                {actor.teamName}
              </dd>
            </div>
            <div className="flex justify-between gap-2">
              <dt className="text-ink-muted">Role</dt>
              <dd data-testid="home-role">
                <Badge tone="ember">{ROLE_LABELS[actor.role]}</Badge>
              </dd>
            </div>
          </dl>
        </Card>
        <Card title="What you can do here" className="md:col-span-2">
          <ul className="list-disc space-y-1 pl-5 text-sm text-ink-soft">
            {can(actor.role, "cases.create") && <li>Build cases and run evaluations against the team&apos;s approved Cp models.</li>}
            {can(actor.role, "models.decide") && <li>Maintain the Cp library and approve colleagues&apos; proposed model versions.</li>}
            {can(actor.role, "cases.review") && <li>Compare naive and corrected results on submitted cases and sign them off.</li>}
            {can(actor.role, "members.manage") && <li>Manage members, roles and invitations for {actor.teamName}.</li>}
          </ul>
        </Card>
      </div>
      <h2 className="mb-3 mt-8 text-lg font-semibold">Waiting for you</h2>
      <div className="grid gap-4 md:grid-cols-2 lg:grid-cols-4">
        {can(actor.role, "cases.create") && (
          <Card title={<span data-testid="home-drafts">My drafts and returned cases ({waiting.drafts.length})</span>}>
            {waiting.drafts.length === 0 ? (
              <p className="text-sm text-ink-muted">
                Nothing open.{" "}
                <Link className={link} href="/cases/new">
                  Start a case
                </Link>
                .
              </p>
            ) : (
              <ul className="space-y-2 text-sm">
                {waiting.drafts.slice(0, 6).map((c) => (
                  <li key={c.id}>
                    <Link className={link} href={`/cases/${c.id}`}>
                      {c.title}
                    </Link>{" "}
                    <StatusBadge status={c.status} />
                  </li>
                ))}
              </ul>
            )}
          </Card>
        )}
        {can(actor.role, "cases.review") && (
          <Card title={<span data-testid="home-reviews">Cases waiting for my review ({waiting.reviews.length})</span>}>
            {waiting.reviews.length === 0 ? (
              <p className="text-sm text-ink-muted">The review queue is empty.</p>
            ) : (
              <ul className="space-y-2 text-sm">
                {waiting.reviews.slice(0, 6).map((c) => (
                  <li key={c.id}>
                    <Link className={link} href={`/cases/${c.id}`}>
                      {c.title}
                    </Link>
                    <span className="block text-xs text-ink-muted">
                      {c.authorName} · r{c.latestRevision}
                    </span>
                  </li>
                ))}
              </ul>
            )}
          </Card>
        )}
        {can(actor.role, "models.decide") && (
          <Card title={<span data-testid="home-proposals">Proposals waiting for my approval ({waiting.proposals})</span>}>
            {waiting.proposalItems.length === 0 ? (
              <p className="text-sm text-ink-muted">
                No proposed model versions from colleagues.{" "}
                <Link className={link} href="/library">
                  Open the library
                </Link>
                .
              </p>
            ) : (
              <ul className="space-y-2 text-sm" data-testid="home-proposal-list">
                {waiting.proposalItems.slice(0, 6).map((p) => (
                  <li key={p.versionId}>
                    <Link className={link} href={`/library/versions/${p.versionId}`}>
                      {p.modelName} · v{p.versionNumber}
                    </Link>
                    <span className="block text-xs text-ink-muted">
                      {p.formula}
                      {p.authorName ? ` · proposed by ${p.authorName}` : ""}
                      {p.proposedAt ? ` · ${p.proposedAt.slice(0, 10)}` : ""}
                    </span>
                  </li>
                ))}
                {waiting.proposalItems.length > 6 && (
                  <li>
                    <Link className={link} href="/library?status=proposed">
                      All {waiting.proposalItems.length} proposals
                    </Link>
                  </li>
                )}
              </ul>
            )}
          </Card>
        )}
        <Card title={<span data-testid="home-decisions">Recent decisions ({waiting.decisions.count30d} in 30 days)</span>}>
          {waiting.decisions.items.length === 0 ? (
            <p className="text-sm text-ink-muted">No review decisions yet.</p>
          ) : (
            <ul className="space-y-2 text-sm">
              {waiting.decisions.items.map((d) => (
                <li key={d.id}>
                  <Link className={link} href={`/cases/${d.caseId}`}>
                    {d.caseTitle}
                  </Link>{" "}
                  <span className={d.decision === "approved" ? "text-moss-700" : "text-flag-700"}>{d.decision}</span>
                  <span className="block text-xs text-ink-muted">
                    by {d.reviewerName}, r{d.revision}
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
