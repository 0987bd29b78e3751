import Link from "next/link";
import { CollapsibleFilters } from "@/components/library/collapsible-filters";
import { ScopeBadge, StatusBadge } from "@/components/library/status-badge";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { inputClass } from "@/components/ui/field";
import { Pager } from "@/components/ui/pager";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { listModels } from "@/lib/services/library";
import { CP_FORMS } from "@/lib/thermo/schema";
import { FAMILY_LABELS, listModelsQuerySchema } from "@/lib/validation/library";

export const metadata = { title: "Library" };

const STATUS_OPTIONS = [
  ["current", "Approved, else open draft"],
  ["approved", "Approved only"],
  ["proposed", "Awaiting approval"],
  ["draft", "Drafts"],
  ["rejected", "Rejected"],
  ["superseded", "Superseded"],
  ["all", "Every version"],
] as const;

type Search = Promise<Record<string, string | string[] | undefined>>;

export default async function LibraryPage({ searchParams }: { searchParams: Search }) {
  const actor = requireUser(await getActor());
  const raw = Object.fromEntries(Object.entries(await searchParams).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v]));
  const parsed = listModelsQuerySchema.safeParse(raw);
  const query = parsed.success ? parsed.data : listModelsQuerySchema.parse({});
  const result = await listModels(actor, query);
  const filtered = query.q || query.phase || query.form || query.status !== "current" || query.scope !== "all";
  const pageHref = (page: number) => `/library?${new URLSearchParams({ ...Object.fromEntries(Object.entries(query).map(([k, v]) => [k, String(v)])), page: String(page) })}`;
  return (
    <>
      <PageHeader
        title="Cp library"
        lead="Heat-capacity models per species and phase. Published reference sets are read-only; team models are drafted, proposed and approved by a second steward."
        action={
          <div className="flex flex-wrap gap-2">
            {can(actor.role, "models.draft") && (
              <Link href="/library/new" className={buttonClass("primary")}>
                New model
              </Link>
            )}
            {can(actor.role, "datasets.upload") && (
              <Link href="/library/upload" className={buttonClass("secondary")}>
                Fit measured data
              </Link>
            )}
            <Link href="/library/datasets" className={buttonClass("secondary")}>
              Datasets
            </Link>
            <Link href="/library/transfer" className={buttonClass("secondary")}>
              Import / export
            </Link>
          </div>
        }
      />
      <Card>
        <form className="grid gap-3 sm:grid-cols-2 lg:grid-cols-[2fr_1fr_1fr_1.3fr_1fr_auto] lg:items-end" role="search" aria-label="Search the library">
          <label className="space-y-1 text-sm font-medium text-ink-soft">
            <span>Formula or name</span>
            <input name="q" defaultValue={query.q} placeholder="CH4, water, Shomate…" className={inputClass} />
          </label>
          <CollapsibleFilters active={[query.phase, query.form, query.status !== "current", query.scope !== "all"].filter(Boolean).length}>
            <label className="space-y-1 text-sm font-medium text-ink-soft">
              <span>Phase</span>
              <select name="phase" defaultValue={query.phase} className={inputClass}>
                <option value="">Any</option>
                <option value="g">Gas</option>
                <option value="l">Liquid</option>
                <option value="cr">Solid</option>
              </select>
            </label>
            <label className="space-y-1 text-sm font-medium text-ink-soft">
              <span>Cp form</span>
              <select name="form" defaultValue={query.form} className={inputClass}>
                <option value="">Any</option>
                {CP_FORMS.map((f) => (
                  <option key={f} value={f}>
                    {f}
                  </option>
                ))}
              </select>
            </label>
            <label className="space-y-1 text-sm font-medium text-ink-soft">
              <span>Status</span>
              <select name="status" defaultValue={query.status} className={inputClass}>
                {STATUS_OPTIONS.map(([v, l]) => (
                  <option key={v} value={v}>
                    {l}
                  </option>
                ))}
              </select>
            </label>
            <label className="space-y-1 text-sm font-medium text-ink-soft">
              <span>Source</span>
              <select name="scope" defaultValue={query.scope} className={inputClass}>
                <option value="all">Reference and team</option>
                <option value="reference">Reference only</option>
                <option value="team">{actor.teamName} only</option>
              </select>
            </label>
          </CollapsibleFilters>
          <button type="submit" className={buttonClass("primary")}>
            Search
          </button>
        </form>
        {!parsed.success && (
          <p role="alert" className="mt-2 text-sm text-flag-700">
            Some filters were not understood and were reset.
          </p>
        )}
      </Card>

      <div className="mt-6" data-testid="library-results">
        {result.items.length === 0 ? (
          <Card>
            <div className="py-8 text-center">
              <p className="text-sm font-medium text-ink">{filtered ? "No models match these filters." : "The library is empty."}</p>
              <p className="mt-1 text-sm text-ink-muted">
                {filtered ? (
                  <>
                    Try another formula, or{" "}
                    <Link className="text-frost-700 underline" href="/library">
                      clear the filters
                    </Link>
                    .
                  </>
                ) : (
                  "Seed the reference library or import a library file."
                )}
              </p>
            </div>
          </Card>
        ) : (
          <>
            <p className="mb-2 text-xs text-ink-muted" data-testid="library-count">
              {result.total} model{result.total === 1 ? "" : "s"} · page {result.page} of {result.pages}
            </p>
            <ul className="divide-y divide-ink-line overflow-hidden rounded-lg border border-ink-line bg-white shadow-card">
              {result.items.map((m) => (
                <li key={m.id} className="flex flex-col gap-2 px-4 py-3 sm:flex-row sm:items-center sm:justify-between" data-testid="model-row">
                  <div className="min-w-0">
                    <p className="flex flex-wrap items-center gap-2">
                      <Link href={`/library/species/${m.species.id}${m.shown ? `?v=${m.shown.id}` : ""}`} className="font-semibold text-ink hover:text-frost-700">
                        {m.name}
                      </Link>
                      <ScopeBadge scope={m.scope} />
                    </p>
                    <p className="mt-0.5 text-xs text-ink-muted">
                      {m.species.displayName} · {FAMILY_LABELS[m.family] ?? m.family}
                      {m.shown && (
                        <>
                          {" "}
                          · {m.shown.phases.join(", ")} · {m.shown.forms.join(", ")}
                          {m.shown.rangeK && (
                            <>
                              {" "}
                              · {m.shown.rangeK[0]}–{m.shown.rangeK[1]} K
                            </>
                          )}
                        </>
                      )}
                    </p>
                  </div>
                  <div className="flex shrink-0 flex-wrap items-center gap-2 text-xs">
                    {m.shown ? (
                      <Link href={`/library/versions/${m.shown.id}`} className="flex items-center gap-2 hover:underline">
                        <span className="text-ink-muted">v{m.shown.versionNumber}</span>
                        <StatusBadge status={m.shown.status} />
                      </Link>
                    ) : (
                      <span className="text-ink-muted">no versions</span>
                    )}
                    {m.openCount > 0 && m.shown?.status === "approved" && (
                      <span className="text-ember-700">
                        {m.openCount} open draft{m.openCount === 1 ? "" : "s"}
                      </span>
                    )}
                  </div>
                </li>
              ))}
            </ul>
            <Pager
              previousHref={result.page > 1 ? pageHref(result.page - 1) : null}
              nextHref={result.page < result.pages ? pageHref(result.page + 1) : null}
              status={`Page ${result.page} of ${result.pages}`}
            />
          </>
        )}
      </div>
    </>
  );
}
