import Link from "next/link";
import { StatusBadge } from "@/components/cases/status-badge";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { DataTable, type Column } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { listCases } from "@/lib/services/cases";
import { CASE_STATUSES, type CaseStatus } from "@/lib/validation/cases";

export const metadata = { title: "Cases" };

const FILTERS: { key: CaseStatus | "all" | "mine"; label: string }[] = [
  { key: "all", label: "All" },
  { key: "mine", label: "Mine" },
  { key: "draft", label: "Drafts" },
  { key: "submitted", label: "Awaiting review" },
  { key: "returned", label: "Returned" },
  { key: "approved", label: "Approved" },
];

const COLUMNS: Column<Awaited<ReturnType<typeof listCases>>[number]>[] = [
  {
    key: "title",
    header: "Case",
    className: "font-medium",
    cell: (c) => (
      <Link className="underline decoration-ink-line underline-offset-2 hover:decoration-ink" href={`/cases/${c.id}`}>
        {c.title}
      </Link>
    ),
  },
  { key: "reaction", header: "Reaction", className: "whitespace-nowrap", cell: (c) => c.reaction },
  { key: "span", header: "Span", className: "text-xs text-ink-muted", cell: (c) => c.span },
  {
    key: "status",
    header: "Status",
    cell: (c) => (
      <>
        <StatusBadge status={c.status} />
        {c.latestRevision ? <span className="ml-1 text-xs text-ink-muted">r{c.latestRevision}</span> : null}
      </>
    ),
  },
  { key: "author", header: "Author", className: "text-ink-soft", cell: (c) => c.authorName },
  { key: "updated", header: "Updated", className: "text-xs text-ink-muted", cell: (c) => c.updatedAt.slice(0, 10) },
];

export default async function CasesPage({ searchParams }: { searchParams: Promise<{ show?: string }> }) {
  const actor = requireUser(await getActor());
  const show = (await searchParams).show ?? "all";
  const status = (CASE_STATUSES as readonly string[]).includes(show) ? (show as CaseStatus) : undefined;
  const cases = await listCases(actor, { status, mine: show === "mine" });
  return (
    <>
      <PageHeader
        title="Cases"
        lead="Reactions and phase changes evaluated over a temperature span, corrected against naive."
        action={
          can(actor.role, "cases.create") ? (
            <Link href="/cases/new" className={buttonClass("primary")}>
              New case
            </Link>
          ) : undefined
        }
      />
      <nav aria-label="Filter cases" className="mb-4 flex flex-wrap gap-2 text-sm">
        {FILTERS.map((f) => (
          <Link
            key={f.key}
            href={f.key === "all" ? "/cases" : `/cases?show=${f.key}`}
            aria-current={show === f.key ? "page" : undefined}
            className={`rounded-full px-3 py-1 ring-1 ring-inset ${show === f.key ? "bg-ink text-paper ring-ink" : "bg-white text-ink-soft ring-ink-line hover:bg-paper-deep"}`}
          >
            {f.label}
          </Link>
        ))}
      </nav>
      <Card>
        {cases.length === 0 ? (
          <p className="text-sm text-ink-muted">No cases here yet.</p>
        ) : (
          <div className="overflow-x-auto">
            <DataTable testId="case-list" columns={COLUMNS} rows={cases} rowKey={(c) => c.id} />
          </div>
        )}
      </Card>
    </>
  );
}
