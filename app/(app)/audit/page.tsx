import Link from "next/link";
import { redirect } from "next/navigation";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { inputClass } from "@/components/ui/field";
import { Pager } from "@/components/ui/pager";
import { DataTable, type Column } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { auditFacets, listAudit, type AuditEventDto } from "@/lib/services/audit";
import { auditFilterOf, auditQuerySchema } from "@/lib/validation/audit";

export const metadata = { title: "Audit trail" };

type Search = Promise<Record<string, string | string[] | undefined>>;

const PAGE = 50;

/** Where a record lives in the app, when it has a screen. */
function recordHref(e: AuditEventDto): string | null {
  if (e.entityType === "case") return `/cases/${e.entityId}`;
  if (e.entityType === "model-version") return `/library/versions/${e.entityId}`;
  if (e.entityType === "species") return `/library/species/${e.entityId}`;
  if (e.entityType === "dataset") return `/library/datasets/${e.entityId}`;
  if (e.entityType === "membership" || e.entityType === "invitation") return "/team";
  return null;
}

function flat(value: unknown, prefix = "", out = new Map<string, unknown>()): Map<string, unknown> {
  if (value !== null && typeof value === "object" && !Array.isArray(value)) {
    for (const [k, v] of Object.entries(value)) flat(v, prefix ? `${prefix}.${k}` : k, out);
  } else out.set(prefix, value);
  return out;
}

const short = (v: unknown, max = 80) => {
  if (v === null || v === undefined) return "—";
  const text = typeof v === "string" ? v : JSON.stringify(v);
  return text.length > max ? `${text.slice(0, max - 1)}…` : text;
};

/** What moved, field by field (`inputs.temperatures.stepK: 5 → 10`), so a reader need not open the JSON. */
function change(e: AuditEventDto): string[] {
  const before = e.before && typeof e.before === "object" ? flat(e.before) : null;
  const after = e.after && typeof e.after === "object" ? flat(e.after) : null;
  if (before && after) {
    const paths = [...new Set([...before.keys(), ...after.keys()])].filter((p) => JSON.stringify(before.get(p) ?? null) !== JSON.stringify(after.get(p) ?? null));
    const lines = paths.slice(0, 6).map((p) => `${p}: ${short(before.get(p))} → ${short(after.get(p))}`);
    if (paths.length > 6) lines.push(`… and ${paths.length - 6} more`);
    return lines.length ? lines : ["no field changed"];
  }
  const one = after ?? before;
  if (one) return [...one].slice(0, 6).map(([p, v]) => `${p}: ${short(v)}`);
  return ["—"];
}

const COLUMNS: Column<AuditEventDto>[] = [
  { key: "at", header: "When (UTC)", className: "whitespace-nowrap tabular text-xs", cell: (e) => e.at.slice(0, 19).replace("T", " ") },
  { key: "actor", header: "Actor", className: "whitespace-nowrap", cell: (e) => e.actorName ?? "system" },
  { key: "action", header: "Action", className: "whitespace-nowrap font-mono text-xs", cell: (e) => e.action },
  {
    key: "record",
    header: "Record",
    className: "whitespace-nowrap",
    cell: (e) => {
      const href = recordHref(e);
      return (
        <>
          {href ? (
            <Link className="underline" href={href}>
              {e.entityType} {e.entityId}
            </Link>
          ) : (
            `${e.entityType} ${e.entityId}`
          )}{" "}
          <Link
            className="text-xs text-frost-700 underline"
            href={`/audit?entityType=${encodeURIComponent(e.entityType)}&entityId=${encodeURIComponent(e.entityId)}`}
            aria-label={`Only ${e.entityType} ${e.entityId}`}
          >
            only this
          </Link>
        </>
      );
    },
  },
  {
    key: "change",
    header: "Change",
    className: "max-w-md break-all font-mono text-xs text-ink-soft",
    cell: (e) =>
      change(e).map((line, i) => (
        <span key={i} className="block">
          {line}
        </span>
      )),
  },
];

export default async function AuditPage({ searchParams }: { searchParams: Search }) {
  const actor = requireUser(await getActor());
  if (!can(actor.role, "audit.view")) redirect("/");
  const raw = Object.fromEntries(
    Object.entries(await searchParams).filter(([k, v]) => typeof v === "string" && ["entityType", "entityId", "actorId", "action", "beforeId"].includes(k)),
  ) as Record<string, string>;
  const parsed = auditQuerySchema.safeParse(raw);
  const query = parsed.success ? parsed.data : {};
  const [events, facets] = await Promise.all([listAudit(actor, { ...auditFilterOf(query), limit: PAGE }), auditFacets(actor)]);
  const keep = new URLSearchParams(Object.entries(raw).filter(([k, v]) => k !== "beforeId" && v));
  const older = events.length === PAGE ? `/audit?${new URLSearchParams([...keep.entries(), ["beforeId", String(events[events.length - 1].id)]])}` : null;
  const label = "space-y-1 text-sm text-ink-soft";
  return (
    <>
      <PageHeader
        title="Audit trail"
        lead={`Who did what to which record in ${actor.teamName}, newest first. Every change is written here in the same transaction as the change itself.`}
      />
      <Card className="mb-4">
        <form method="get" action="/audit" className="grid items-end gap-3 sm:grid-cols-2 lg:grid-cols-[1fr_8rem_1fr_1fr_auto]" aria-label="Filter the audit trail">
          <label className={label}>
            <span className="font-medium">Record type</span>
            <select name="entityType" defaultValue={raw.entityType ?? ""} className={inputClass} aria-label="Record type">
              <option value="">Any record</option>
              {facets.entityTypes.map((t) => (
                <option key={t} value={t}>
                  {t}
                </option>
              ))}
            </select>
          </label>
          <label className={label}>
            <span className="font-medium">Record id</span>
            <input name="entityId" defaultValue={raw.entityId ?? ""} inputMode="numeric" className={inputClass} aria-label="Record id" />
          </label>
          <label className={label}>
            <span className="font-medium">Actor</span>
            <select name="actorId" defaultValue={raw.actorId ?? ""} className={inputClass} aria-label="Actor">
              <option value="">Anyone</option>
              {facets.actors.map((a) => (
                <option key={a.id} value={a.id}>
                  {a.name}
                </option>
              ))}
            </select>
          </label>
          <label className={label}>
            <span className="font-medium">Action</span>
            <select name="action" defaultValue={raw.action ?? ""} className={inputClass} aria-label="Action">
              <option value="">Any action</option>
              {facets.actions.map((a) => (
                <option key={a} value={a}>
                  {a}
                </option>
              ))}
            </select>
          </label>
          <div className="flex gap-2">
            <button type="submit" className={buttonClass("primary")}>
              Filter
            </button>
            <Link href="/audit" className={buttonClass("ghost")}>
              Clear
            </Link>
          </div>
        </form>
        {!parsed.success && (
          <p role="alert" className="mt-2 text-sm text-flag-700">
            {parsed.error.issues[0]?.message ?? "Those filters are not valid."} Showing everything.
          </p>
        )}
      </Card>
      <Card title={`Events (${events.length}${older ? "+" : ""})`}>
        {events.length === 0 ? (
          <p className="text-sm text-ink-muted">No events match these filters.</p>
        ) : (
          <div className="overflow-x-auto">
            <DataTable alignTop testId="audit-table" rowTestId="audit-row" columns={COLUMNS} rows={events} rowKey={(e) => e.id} />
          </div>
        )}
        <Pager className="mt-3" nextHref={older} nextLabel="Older events →" />
      </Card>
    </>
  );
}
