import { orNotFound, pageId } from "@/lib/pages";
import Link from "next/link";
import { PropertyCharts } from "@/components/library/property-charts";
import { phaseLabel } from "@/components/library/curve-rows";
import { ScopeBadge, StatusBadge } from "@/components/library/status-badge";
import { VersionActions } from "@/components/library/version-actions";
import { ImpactPanel } from "@/components/library/impact-panel";
import { Caution } from "@/components/results/caution";
import { Card, PageHeader } from "@/components/ui/card";
import { DataTable } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { getVersion, versionAudit, versionCurve } from "@/lib/services/library";
import { FAMILY_LABELS } from "@/lib/validation/library";
import { approveVersionAction, rejectVersionAction } from "./actions";

type Props = { params: Promise<{ id: string }> };

const ROLE_WORDS: Record<string, string> = {
  author: "author",
  editor: "edited",
  proposer: "proposed",
  source: "worked on the draft it started from",
  uploader: "uploaded the measured data it was fitted to",
};

const ACTION_WORDS: Record<string, string> = {
  "model-version.created": "created the draft",
  "model-version.edited": "edited the draft",
  "model-version.proposed": "proposed it for approval",
  "model-version.approved": "approved it",
  "model-version.rejected": "rejected it",
  "model-version.superseded": "superseded it by approving a newer version",
  "model-version.copied": "copied it from the reference library",
  "model-version.imported": "imported it from a library file",
  "model-version.fitted": "fitted it to measured data",
  "model-version.seeded": "loaded it as a published reference set",
};

function coeffText(coeffs: unknown): string {
  if (Array.isArray(coeffs)) return coeffs.map((c, i) => `a${i + 1} = ${c}`).join(", ");
  if (coeffs && typeof coeffs === "object") {
    const o = coeffs as Record<string, unknown>;
    if (Array.isArray(o.terms)) return (o.terms as { k: number; c: number }[]).map((t) => `${t.c}·T^${t.k}`).join(" + ");
    if (Array.isArray(o.points)) return `${(o.points as unknown[]).length} tabulated points`;
    return Object.entries(o)
      .map(([k, v]) => `${k} = ${v}`)
      .join(", ");
  }
  return String(coeffs);
}

export default async function VersionPage({ params }: Props) {
  const actor = requireUser(await getActor());
  const id = await pageId(params);
  const v = await orNotFound(getVersion(actor, id));
  const [audit, curve] = await Promise.all([versionAudit(actor, id), versionCurve(actor, id).catch((e: Error) => e)]);
  const team = v.scope === "team";
  const mine = v.authorId === actor.userId;
  // Four-eyes: anyone who changed or proposed this version leaves the decision to someone else.
  const contributed = v.contributors.some((c) => c.userId === actor.userId);
  const allowed = {
    edit: team && v.status === "draft" && (mine ? can(actor.role, "models.draft") : can(actor.role, "models.edit")),
    propose: team && v.status === "draft" && (mine ? can(actor.role, "models.draft") : can(actor.role, "models.edit")),
    decide: team && v.status === "proposed" && can(actor.role, "models.decide") && !contributed,
    ownWork: team && v.status === "proposed" && can(actor.role, "models.decide") && contributed,
    newDraft: team && can(actor.role, "models.draft"),
    copy: !team && can(actor.role, "models.edit"),
    // The author, or a steward, takes back a proposal or deletes a draft or proposal (the service checks again).
    withdraw: team && v.status === "proposed" && (mine ? can(actor.role, "models.draft") : can(actor.role, "models.edit")),
    remove: team && (v.status === "draft" || v.status === "proposed") && (mine ? can(actor.role, "models.draft") : can(actor.role, "models.edit")),
  };
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href={`/library/species/${v.species.id}?v=${v.id}`} className="text-frost-700 hover:underline">
          ← {v.species.formula} · {v.species.displayName}
        </Link>
      </p>
      <PageHeader
        title={`${v.model.name}, version ${v.versionNumber}`}
        lead={
          <span className="flex flex-wrap items-center gap-2">
            <StatusBadge status={v.status} /> <ScopeBadge scope={v.scope} /> {FAMILY_LABELS[v.model.family] ?? v.model.family}
          </span>
        }
      />
      {v.status !== "approved" && v.status !== "superseded" && (
        <p className="mb-4 rounded-md border border-ember-100 bg-ember-50 px-3 py-2 text-sm text-ember-700" data-testid="not-approved-note">
          This version is {v.status === "draft" ? "a draft" : v.status}: it is not part of the approved library
          {v.status === "proposed" ? " until a steward who neither changed nor proposed it approves it" : ""}.
        </p>
      )}
      {v.status === "rejected" && v.decisionReason && (
        <p className="mb-4 rounded-md border border-flag-600/30 bg-flag-50 px-3 py-2 text-sm text-flag-700" data-testid="rejection-reason">
          Rejected by {v.decidedByName ?? "a steward"}: {v.decisionReason}
        </p>
      )}
      <div className="grid gap-6 lg:grid-cols-[1fr_22rem]">
        <div className="space-y-6">
          <Card title="Curves">
            {curve instanceof Error ? (
              <p role="alert" className="text-sm text-flag-700">
                {curve.message}
              </p>
            ) : (
              <PropertyCharts a={curve} labelA={`v${v.versionNumber}`} />
            )}
            <Caution className="mt-4" />
          </Card>
          {team && v.status !== "rejected" && (
            <Card title="Impact on pinned cases">
              <ImpactPanel versionId={v.id} versionStatus={v.status} canStart={can(actor.role, "models.draft")} />
            </Card>
          )}
          <Card title="Segments">
            <div className="overflow-x-auto">
              <DataTable
                className="min-w-[36rem]"
                alignTop
                testId="segments-table"
                columns={[
                  { key: "phase", header: "Phase", cell: (s) => phaseLabel(s.phase) },
                  { key: "form", header: "Form", cell: (s) => s.form },
                  { key: "range", header: "Range (K)", className: "tabular whitespace-nowrap", cell: (s) => `${String(s.tminK)}–${String(s.tmaxK)}` },
                  { key: "coeffs", header: "Coefficients", className: "break-all font-mono text-xs", cell: (s) => coeffText(s.coeffs) },
                ]}
                rows={v.data.segments}
                rowKey={(_, i) => i}
              />
            </div>
            {v.data.transitions?.length ? (
              <p className="mt-3 text-sm">Transitions: {v.data.transitions.map((t) => `${t.from} → ${t.to} at ${t.tK} K, ΔH ${t.dHkJ} kJ/mol`).join("; ")}</p>
            ) : null}
            {v.data.reference && (
              <p className="mt-2 text-sm">
                Anchor: {phaseLabel(v.data.reference.phase)} at {String(v.data.reference.tK)} K, H = {String(v.data.reference.hkJ)} kJ/mol, S = {String(v.data.reference.sJ)}{" "}
                J/(mol·K)
              </p>
            )}
            <p className="mt-2 text-xs text-ink-muted">
              Standard pressure of the source: {(v.data.standardPressurePa ?? 100000).toLocaleString("en")} Pa
              {v.data.standardPressurePa === 101325 ? " (converted to 1 bar for gases)" : ""}.
            </p>
          </Card>
        </div>
        <div className="space-y-6">
          <Card title="Workflow">
            <VersionActions
              versionId={v.id}
              modelId={v.modelId}
              allowed={allowed}
              label={`${v.model.name}, version ${v.versionNumber}`}
              speciesHref={`/library/species/${v.species.id}`}
              decisions={{ approve: approveVersionAction, reject: rejectVersionAction }}
            />
            <dl className="mt-4 space-y-1 text-sm">
              <div className="flex justify-between gap-2">
                <dt className="text-ink-muted">Author</dt>
                <dd>{v.authorName ?? (v.scope === "reference" ? "Published source" : "—")}</dd>
              </div>
              {v.contributors.length > 0 && (
                <div className="flex justify-between gap-2" data-testid="contributors">
                  <dt className="text-ink-muted">Contributors</dt>
                  <dd className="text-right">{v.contributors.map((c) => `${c.name} (${c.roles.map((r) => ROLE_WORDS[r] ?? r).join(", ")})`).join("; ")}</dd>
                </div>
              )}
              {v.decidedByName && (
                <div className="flex justify-between gap-2">
                  <dt className="text-ink-muted">Decided by</dt>
                  <dd>{v.decidedByName}</dd>
                </div>
              )}
              <div className="flex justify-between gap-2">
                <dt className="text-ink-muted">Updated</dt>
                <dd className="tabular">{v.updatedAt.slice(0, 16).replace("T", " ")}</dd>
              </div>
              {v.datasetId && (
                <div className="flex justify-between gap-2">
                  <dt className="text-ink-muted">Fitted to</dt>
                  <dd>
                    <Link className="text-frost-700 hover:underline" href={`/library/datasets/${v.datasetId}`}>
                      dataset #{v.datasetId}
                    </Link>
                  </dd>
                </div>
              )}
            </dl>
            <a className="mt-3 inline-block text-sm text-frost-700 hover:underline" href={`/api/v1/library/export?models=${v.modelId}&versions=all`}>
              Export this model (JSON)
            </a>
          </Card>
          <Card title="Source">
            <p className="text-sm" data-testid="citation">
              {v.citation}
            </p>
            {v.uncertainty && (
              <p className="mt-2 text-xs text-ink-muted">
                Uncertainty:{" "}
                {[
                  v.uncertainty.cpRelative != null && `Cp ±${(v.uncertainty.cpRelative * 100).toPrecision(2)} %`,
                  v.uncertainty.dfHkJ != null && `ΔfH° ±${v.uncertainty.dfHkJ} kJ/mol`,
                  v.uncertainty.sJ != null && `S° ±${v.uncertainty.sJ} J/(mol·K)`,
                ]
                  .filter(Boolean)
                  .join(", ")}
              </p>
            )}
            {v.changeNote && <p className="mt-2 text-sm text-ink-soft">{v.changeNote}</p>}
          </Card>
          <Card title="Audit trail">
            <ol className="space-y-2 text-sm" data-testid="audit-trail">
              {audit.map((e) => (
                <li key={e.id}>
                  <span className="font-medium">{e.actorName ?? "Heatpath"}</span> {ACTION_WORDS[e.action] ?? e.action}
                  {e.action === "model-version.rejected" && typeof e.after === "object" && e.after && "reason" in e.after ? (
                    <>: “{String((e.after as { reason: string }).reason)}”</>
                  ) : null}
                  <span className="block text-xs text-ink-muted tabular">{e.at.slice(0, 16).replace("T", " ")} UTC</span>
                </li>
              ))}
            </ol>
          </Card>
        </div>
      </div>
    </>
  );
}
