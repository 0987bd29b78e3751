import Link from "next/link";
import { Caution } from "@/components/results/caution";
import { Card, PageHeader } from "@/components/ui/card";
import { DataTable } from "@/components/ui/table";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { orNotFound, pageId } from "@/lib/pages";
import { fixed, kelvin } from "@/lib/cases/format";
import { AppError } from "@/lib/errors";
import { diffSnapshots, getCase } from "@/lib/services/cases";

export const metadata = { title: "Compare snapshots" };

type Props = { params: Promise<{ id: string }>; searchParams: Promise<{ from?: string; to?: string }> };

const show = (v: unknown) => (v === null || v === undefined ? "—" : typeof v === "object" ? JSON.stringify(v) : String(v));
const num = (s: string | undefined) => (s && /^\d+$/.test(s) ? Number(s) : undefined);

export default async function DiffPage({ params, searchParams }: Props) {
  const actor = requireUser(await getActor());
  const id = await pageId(params);
  const sp = await searchParams;
  const c = await orNotFound(getCase(actor, id));
  // A case with one snapshot has nothing to compare (409): the page says so.
  const diff = await orNotFound(diffSnapshots(actor, id, num(sp.from), num(sp.to))).catch((e) => {
    if (e instanceof AppError && e.status === 409) return null;
    throw e;
  });
  return (
    <>
      <PageHeader
        title={`Compare snapshots: ${c.title}`}
        lead={diff ? `Revision ${diff.from.revision} against revision ${diff.to.revision}. Old snapshots are never rewritten.` : "This case needs two snapshots to compare."}
        action={
          <Link className="text-sm underline" href={`/cases/${id}`}>
            Back to the case
          </Link>
        }
      />
      {diff && (
        <div className="space-y-4" data-testid="diff">
          <div className="grid gap-4 md:grid-cols-2">
            {[diff.from, diff.to].map((s) => (
              <Card key={s.revision} title={`Revision ${s.revision}`}>
                <p className="text-xs text-ink-muted">
                  {s.createdAt.slice(0, 16).replace("T", " ")} UTC · {s.createdByName} · engine {s.engineVersion}
                </p>
                <code className="block break-all text-xs">{s.hash}</code>
                <p className="mt-1 text-sm">
                  {s.decision
                    ? `${s.decision.decision === "approved" ? "Approved" : "Returned"} by ${s.decision.reviewerName}${s.decision.reason ? `: ${s.decision.reason}` : ""}`
                    : "Awaiting decision"}
                </p>
              </Card>
            ))}
          </div>
          <Card title={`Changed inputs (${diff.inputs.length})`}>
            {diff.inputs.length === 0 ? (
              <p className="text-sm text-ink-muted">No input changed.</p>
            ) : (
              <DataTable
                columns={[
                  { key: "path", header: "Field", className: "font-mono text-xs", cell: (ch) => ch.path },
                  { key: "from", header: `Revision ${diff.from.revision}`, className: "text-ink-muted", cell: (ch) => show(ch.from) },
                  { key: "to", header: `Revision ${diff.to.revision}`, className: "font-medium", cell: (ch) => show(ch.to) },
                ]}
                rows={diff.inputs}
                rowKey={(ch) => ch.path}
              />
            )}
          </Card>
          <Card title={`Changed pins (${diff.pins.length})`}>
            {diff.pins.length === 0 ? (
              <p className="text-sm text-ink-muted">Same model versions.</p>
            ) : (
              <ul className="space-y-1 text-sm">
                {diff.pins.map((p) => (
                  <li key={p.key}>
                    <strong>{p.key}</strong>: {p.from ? `${p.from.modelName} v${p.from.versionNumber}` : "—"} → {p.to ? `${p.to.modelName} v${p.to.versionNumber}` : "—"}
                  </li>
                ))}
              </ul>
            )}
          </Card>
          {diff.equilibrium.status !== "none" && (
            <Card title="Equilibrium results">
              <div data-testid="diff-equilibrium" data-status={diff.equilibrium.status}>
                {diff.equilibrium.status === "lost" && (
                  <p role="alert" className="rounded-md border border-flag-600/30 bg-flag-50 px-3 py-2 text-sm font-medium text-flag-700">
                    Revision {diff.to.revision} has no equilibrium results: revision {diff.from.revision} had them (key {diff.equilibrium.key[0]}, {diff.equilibrium.pressureBar[0]}{" "}
                    bar). The feed was removed or not carried over.
                  </p>
                )}
                {diff.equilibrium.status === "added" && (
                  <p className="text-sm">
                    Revision {diff.to.revision} adds equilibrium results (key {diff.equilibrium.key[1]}, {diff.equilibrium.pressureBar[1]} bar); revision {diff.from.revision} had
                    none.
                  </p>
                )}
                {diff.equilibrium.status === "unchanged" && <p className="text-sm text-ink-muted">The same equilibrium results at every temperature both share.</p>}
                {diff.equilibrium.status === "changed" && (
                  <>
                    <p className="text-sm font-medium text-ember-700">
                      The equilibrium results changed: largest change in the conversion of {diff.equilibrium.key[1]} {fixed(diff.equilibrium.maxAbsConversion * 100, 3)} percentage
                      points, in a mole fraction {fixed(diff.equilibrium.maxAbsMoleFraction, 5)}, over {diff.equilibrium.common} shared temperatures.
                      {diff.equilibrium.key[0] !== diff.equilibrium.key[1] ? ` Key species ${diff.equilibrium.key[0]} → ${diff.equilibrium.key[1]}.` : ""}
                      {diff.equilibrium.pressureBar[0] !== diff.equilibrium.pressureBar[1]
                        ? ` Pressure ${diff.equilibrium.pressureBar[0]} → ${diff.equilibrium.pressureBar[1]} bar.`
                        : ""}
                    </p>
                    {diff.equilibrium.rows.length > 0 && (
                      <DataTable
                        look="compact"
                        className="mt-3"
                        columns={[
                          { key: "t", header: "T (K)", cell: (p) => fixed(p.tK, 2) },
                          { key: "from", header: `conversion r${diff.from.revision} (%)`, cell: (p) => fixed(p.fromConversion * 100, 3) },
                          { key: "to", header: `conversion r${diff.to.revision} (%)`, cell: (p) => fixed(p.toConversion * 100, 3) },
                        ]}
                        rows={diff.equilibrium.rows}
                        rowKey={(p) => p.tK}
                      />
                    )}
                  </>
                )}
              </div>
            </Card>
          )}
          <Card title="Results">
            <dl className="grid gap-3 text-sm sm:grid-cols-2">
              <div>
                <dt className="text-xs text-ink-muted">Sign case</dt>
                <dd>
                  {diff.signCase[0]} → {diff.signCase[1]}
                </dd>
              </div>
              <div>
                <dt className="text-xs text-ink-muted">Crossovers</dt>
                <dd>
                  naive {kelvin(diff.crossover.naiveK[0])} → {kelvin(diff.crossover.naiveK[1])}; corrected {diff.crossover.correctedK[0].map(kelvin).join(", ") || "none"} →{" "}
                  {diff.crossover.correctedK[1].map(kelvin).join(", ") || "none"}
                </dd>
              </div>
              <div>
                <dt className="text-xs text-ink-muted">At the {diff.points.common} temperatures both share</dt>
                <dd>
                  largest change in ΔrG {fixed(diff.points.maxAbsDGkJ, 4)} kJ/mol, in log10 K {fixed(diff.points.maxAbsLog10K, 5)}
                </dd>
              </div>
              <div>
                <dt className="text-xs text-ink-muted">Warnings</dt>
                <dd>
                  {diff.warnings.added.length === 0 && diff.warnings.removed.length === 0 ? "unchanged" : null}
                  {diff.warnings.added.map((w) => (
                    <span key={w} className="block text-flag-700" data-testid="warning-added">
                      + new: {w}
                    </span>
                  ))}
                  {/* A warning that went away is news, not a verdict: the cause may have left with an input. */}
                  {diff.warnings.removed.map((w) => (
                    <span key={w} className="block text-ink-soft" data-testid="warning-removed">
                      − no longer raised: {w}
                    </span>
                  ))}
                </dd>
              </div>
            </dl>
            {diff.points.rows.length > 0 && (
              <DataTable
                look="compact"
                className="mt-3"
                columns={[
                  { key: "t", header: "T (K)", cell: (p) => fixed(p.tK, 2) },
                  { key: "g0", header: `ΔrG r${diff.from.revision} (kJ/mol)`, cell: (p) => fixed(p.fromDGkJ, 3) },
                  { key: "g1", header: `ΔrG r${diff.to.revision} (kJ/mol)`, cell: (p) => fixed(p.toDGkJ, 3) },
                  { key: "k0", header: `log10 K r${diff.from.revision}`, cell: (p) => fixed(p.fromLog10K, 4) },
                  { key: "k1", header: `log10 K r${diff.to.revision}`, cell: (p) => fixed(p.toLog10K, 4) },
                ]}
                rows={diff.points.rows}
                rowKey={(p) => p.tK}
              />
            )}
          </Card>
        </div>
      )}
      <Caution className="mt-6" />
    </>
  );
}
