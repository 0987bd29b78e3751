import Link from "next/link";
import { notFound } from "next/navigation";
import { Caution } from "@/components/results/caution";
import { Card, PageHeader } from "@/components/ui/card";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { fixed, kelvin } from "@/lib/cases/format";
import { AppError } from "@/lib/errors";
import { diffSnapshots, getCase } from "@/lib/services/cases";

export const metadata = { title: "Compare snapshots" };

type Props = { params: Promise<{ id: string }>; searchParams: Promise<{ from?: string; to?: string }> };

const show = (v: unknown) => (v === null || v === undefined ? "—" : typeof v === "object" ? JSON.stringify(v) : String(v));
const num = (s: string | undefined) => (s && /^\d+$/.test(s) ? Number(s) : undefined);

export default async function DiffPage({ params, searchParams }: Props) {
  const actor = requireUser(await getActor());
  const id = Number((await params).id);
  const sp = await searchParams;
  if (!Number.isInteger(id) || id <= 0) notFound();
  const fail = (e: unknown): never => {
    if (e instanceof AppError && e.status === 404) notFound();
    throw e;
  };
  const c = await getCase(actor, id).catch(fail);
  const diff = await diffSnapshots(actor, id, num(sp.from), num(sp.to)).catch((e) => {
    if (e instanceof AppError && e.status === 409) return null;
    return fail(e);
  });
  return (
    <>
      <PageHeader
        title={`Compare snapshots: ${c.title}`}
        lead={diff ? `Revision ${diff.from.revision} against revision ${diff.to.revision}. Old snapshots are never rewritten.` : "This case needs two snapshots to compare."}
        action={<Link className="text-sm underline" href={`/cases/${id}`}>Back to the case</Link>}
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
                  {s.decision ? `${s.decision.decision === "approved" ? "Approved" : "Returned"} by ${s.decision.reviewerName}${s.decision.reason ? `: ${s.decision.reason}` : ""}` : "Awaiting decision"}
                </p>
              </Card>
            ))}
          </div>
          <Card title={`Changed inputs (${diff.inputs.length})`}>
            {diff.inputs.length === 0 ? (
              <p className="text-sm text-ink-muted">No input changed.</p>
            ) : (
              <table className="min-w-full text-sm">
                <thead className="text-left text-xs text-ink-muted">
                  <tr><th className="py-1 pr-3 font-medium">Field</th><th className="py-1 pr-3 font-medium">Revision {diff.from.revision}</th><th className="py-1 font-medium">Revision {diff.to.revision}</th></tr>
                </thead>
                <tbody className="divide-y divide-ink-line/60">
                  {diff.inputs.map((ch) => (
                    <tr key={ch.path}><td className="py-1 pr-3 font-mono text-xs">{ch.path}</td><td className="py-1 pr-3 text-flag-700">{show(ch.from)}</td><td className="py-1 text-moss-700">{show(ch.to)}</td></tr>
                  ))}
                </tbody>
              </table>
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
          <Card title="Results">
            <dl className="grid gap-3 text-sm sm:grid-cols-2">
              <div><dt className="text-xs text-ink-muted">Sign case</dt><dd>{diff.signCase[0]} → {diff.signCase[1]}</dd></div>
              <div>
                <dt className="text-xs text-ink-muted">Crossovers</dt>
                <dd>
                  naive {kelvin(diff.crossover.naiveK[0])} → {kelvin(diff.crossover.naiveK[1])}; corrected {diff.crossover.correctedK[0].map(kelvin).join(", ") || "none"} → {diff.crossover.correctedK[1].map(kelvin).join(", ") || "none"}
                </dd>
              </div>
              <div>
                <dt className="text-xs text-ink-muted">At the {diff.points.common} temperatures both share</dt>
                <dd>largest change in ΔrG {fixed(diff.points.maxAbsDGkJ, 4)} kJ/mol, in log10 K {fixed(diff.points.maxAbsLog10K, 5)}</dd>
              </div>
              <div>
                <dt className="text-xs text-ink-muted">Warnings</dt>
                <dd>
                  {diff.warnings.added.length === 0 && diff.warnings.removed.length === 0 ? "unchanged" : null}
                  {diff.warnings.added.map((w) => <span key={w} className="block text-flag-700">+ {w}</span>)}
                  {diff.warnings.removed.map((w) => <span key={w} className="block text-moss-700">− {w}</span>)}
                </dd>
              </div>
            </dl>
            {diff.points.rows.length > 0 && (
              <table className="mt-3 min-w-full text-xs">
                <thead className="text-right text-ink-muted">
                  <tr><th className="py-1 pr-2 font-medium">T (K)</th><th className="py-1 pr-2 font-medium">ΔrG r{diff.from.revision} (kJ/mol)</th><th className="py-1 pr-2 font-medium">ΔrG r{diff.to.revision} (kJ/mol)</th><th className="py-1 pr-2 font-medium">log10 K r{diff.from.revision}</th><th className="py-1 font-medium">log10 K r{diff.to.revision}</th></tr>
                </thead>
                <tbody className="text-right tabular">
                  {diff.points.rows.map((p) => (
                    <tr key={p.tK}><td className="pr-2">{fixed(p.tK, 2)}</td><td className="pr-2">{fixed(p.fromDGkJ, 3)}</td><td className="pr-2">{fixed(p.toDGkJ, 3)}</td><td className="pr-2">{fixed(p.fromLog10K, 4)}</td><td>{fixed(p.toLog10K, 4)}</td></tr>
                  ))}
                </tbody>
              </table>
            )}
          </Card>
        </div>
      )}
      <Caution className="mt-6" />
    </>
  );
}
