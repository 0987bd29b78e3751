import { orNotFound, pageId } from "@/lib/pages";
import { temperaturesText } from "@/components/cases/inputs-card";
import { EquilibriumReport } from "@/components/equilibrium/equilibrium-report";
import { Caution } from "@/components/results/caution";
import { cautionGasOf } from "@/lib/cases/caution";
import { PrintButton } from "@/components/results/print-button";
import { ResultCharts } from "@/components/results/result-charts";
import { ContributionsChart } from "@/components/results/contributions-chart";
import { ContributionsTable } from "@/components/results/contributions-table";
import { ResultSummary, WarningList } from "@/components/results/result-summary";
import { DataTable } from "@/components/ui/table";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { DISPLAY_UNITS, enteredUnit, formatTemperature, gridValue, isDisplayUnit, UNIT_LABELS } from "@/lib/cases/display-unit";
import { fixed, sci } from "@/lib/cases/format";
import { formatQuantity } from "@/lib/cases/temperature";
import { getResults } from "@/lib/services/cases";
import { reportSources } from "@/lib/services/equilibrium";
import { signOffRecord } from "@/lib/services/sign-off";
import { approverText, SignOffRecord } from "@/components/cases/sign-off";

export const metadata = { title: "Case report" };

type Props = { params: Promise<{ id: string }>; searchParams: Promise<{ revision?: string; unit?: string }> };

/** At most this many rows in the printed table summary; the CSV carries every point. */
const SUMMARY_ROWS = 16;

export default async function ReportPage({ params, searchParams }: Props) {
  const actor = requireUser(await getActor());
  const id = await pageId(params);
  const sp = await searchParams;
  const rev = sp.revision;
  const revision = rev && /^\d+$/.test(rev) ? Number(rev) : undefined;
  const data = await orNotFound(getResults(actor, id, revision));
  const r = data.result;
  const gas = cautionGasOf(r);
  // The unit the case was entered in, unless the reader asked for another (?unit=K|degC|degF).
  const unit = isDisplayUnit(sp.unit) ? sp.unit : enteredUnit(data.inputs.temperatures);
  const unitHref = (u: string) => `?${new URLSearchParams({ ...(revision ? { revision: String(revision) } : {}), unit: u })}`;
  const record = data.source === "snapshot" ? await signOffRecord(actor, id, data.revision ?? undefined) : null;
  const pts = r.points;
  const stride = Math.max(1, Math.ceil(pts.length / SUMMARY_ROWS));
  const rowIndexes = pts.map((_, i) => i).filter((i) => i % stride === 0 || i === pts.length - 1);
  const rows = rowIndexes.map((i) => pts[i]);
  const worst = pts.reduce((a, p) => (Math.abs(p.diffKJ) > Math.abs(a.diffKJ) ? p : a), pts[0]);
  const beyond = pts.filter((p) => p.exceedsTolerance).length;
  const coeff = new Map(data.inputs.terms.map((t) => [t.phase ? `${t.formula}(${t.phase})` : t.formula, t.coefficient]));
  return (
    <article className="mx-auto max-w-4xl space-y-5 bg-white p-6 text-sm shadow-card print:max-w-none print:p-0 print:shadow-none" data-testid="report">
      <style>{`@page { size: A4; margin: 14mm; } @media print { main { padding: 0 !important; max-width: none !important; } }`}</style>
      <header className="flex items-start justify-between gap-4 border-b border-ink pb-3">
        <div>
          <p className="text-xs uppercase tracking-wide text-ink-muted">Heatpath case report · {actor.teamName}</p>
          <h1 className="text-xl font-semibold">{data.title}</h1>
          <p className="text-base">{data.reaction}</p>
        </div>
        <div className="flex flex-col items-end gap-2">
          <PrintButton />
          <nav aria-label="Temperature unit" className="no-print flex items-center gap-1 text-xs" data-testid="report-unit-switch">
            <span className="mr-1 text-ink-muted">Temperatures in</span>
            {DISPLAY_UNITS.map((u) => (
              <a
                key={u}
                href={unitHref(u)}
                aria-current={u === unit ? "true" : undefined}
                className={`rounded-md border px-2 py-0.5 font-medium ${u === unit ? "border-ink bg-ink text-paper" : "border-ink-line text-ink hover:bg-paper-deep"}`}
              >
                {UNIT_LABELS[u]}
              </a>
            ))}
          </nav>
        </div>
      </header>

      {record && <SignOffRecord record={record} />}

      <section className="grid grid-cols-2 gap-4 text-xs">
        <div>
          <h2 className="mb-1 text-sm font-semibold">Snapshot</h2>
          {data.source === "snapshot" ? (
            <p>
              Revision {data.revision}, frozen {data.frozenAt?.slice(0, 16).replace("T", " ")} UTC, case status {data.status}.
              <br />
              SHA-256 of the canonical JSON (RFC 8785):{" "}
              <code className="break-all" data-testid="report-hash">
                {data.hash}
              </code>
            </p>
          ) : (
            <p className="font-semibold text-flag-700">Live draft evaluation: not frozen, not reviewed. Submit the case to freeze a snapshot.</p>
          )}
          <p>Engine {r.engine.version}.</p>
        </div>
        <div>
          <h2 className="mb-1 text-sm font-semibold">Inputs</h2>
          <p>
            Temperatures: {temperaturesText(data.inputs.temperatures)} ({pts.length.toLocaleString("en")} points)
          </p>
          <p>Reference temperature: {formatQuantity(data.inputs.referenceK)}</p>
          <p>
            Tolerance: {data.inputs.toleranceKJ} kJ/mol on ΔrG{data.inputs.toleranceKFactor ? `, factor ${data.inputs.toleranceKFactor} on K` : ""}
          </p>
          {data.inputs.notes && <p className="mt-1 whitespace-pre-wrap text-ink-soft">{data.inputs.notes}</p>}
        </div>
      </section>

      <section>
        <h2 className="mb-1 text-sm font-semibold">Pinned model versions</h2>
        <DataTable
          look="numbers"
          align="left"
          columns={[
            { key: "nu", header: "ν", cell: (p) => coeff.get(p.key) },
            { key: "species", header: "Species", className: "font-medium", cell: (p) => p.key },
            {
              key: "model",
              header: "Model and version",
              cell: (p) => (
                <>
                  {p.modelName} · v{p.versionNumber} · <span className={p.status === "approved" ? "" : "font-semibold text-flag-700"}>{p.status}</span>
                </>
              ),
            },
            record && { key: "approver", header: "Approved by", cellTestId: "pin-approver", cell: (p) => approverText(record.pins.find((x) => x.key === p.key)) },
            { key: "citation", header: "Citation", className: "text-ink-soft", cell: (p) => p.citation },
          ]}
          rows={data.pins}
          rowKey={(p) => p.key}
          alignTop
        />
      </section>

      <Caution gas={gas} />

      <section>
        <h2 className="mb-2 text-sm font-semibold">Summary</h2>
        <ResultSummary result={r} unit={unit} />
        <p className="mt-2 text-xs">
          Largest naive − corrected difference: <strong>{fixed(worst?.diffKJ, 3)} kJ/mol</strong> at {formatTemperature(worst?.tK, unit)}; {beyond} of {pts.length} points beyond
          tolerance.
        </p>
      </section>

      <section>
        <ResultCharts result={r} toleranceKJ={data.inputs.toleranceKJ} toleranceKFactor={data.inputs.toleranceKFactor} unit={unit} compact />
      </section>

      <section className="break-inside-avoid">
        <h2 className="mb-1 text-sm font-semibold">
          Table summary{rows.length < pts.length ? ` (every ${stride}th point and the last; the CSV export has all ${pts.length})` : ""}
        </h2>
        <DataTable
          look="numbers"
          testId="report-table"
          columns={[
            { key: "t", header: `T (${UNIT_LABELS[unit]})`, cell: (p) => gridValue(p.tK, unit) },
            { key: "h", header: "ΔrH (kJ/mol)", cell: (p) => fixed(p.dHkJ, 3) },
            { key: "s", header: "ΔrS (J/(mol·K))", cell: (p) => fixed(p.dSJ, 3) },
            { key: "g", header: "ΔrG corrected (kJ/mol)", cell: (p) => fixed(p.dGkJ, 3) },
            { key: "gn", header: "ΔrG naive (kJ/mol)", cell: (p) => fixed(p.naiveDGkJ, 3) },
            { key: "diff", header: "naive − corrected (kJ/mol)", cell: (p) => `${fixed(p.diffKJ, 3)}${p.exceedsTolerance ? " *" : ""}` },
            { key: "k", header: "K", cell: (p) => sci(p.K, 4) },
          ]}
          rows={rows}
          rowKey={(p) => p.tK}
          rowClassName={(p) => (p.exceedsTolerance ? "font-semibold" : undefined)}
        />
        <p className="mt-1 text-xs text-ink-muted">* beyond tolerance. H on the formation basis; G = H − TS of each species is not ΔfG°(T).</p>
      </section>

      <section className="break-inside-avoid">
        <h2 className="mb-1 text-sm font-semibold">Which species moves ΔrG away from the naive line</h2>
        <ContributionsChart result={r} compact unit={unit} />
        <div className="mt-2">
          <ContributionsTable result={r} rowIndexes={rowIndexes} />
        </div>
      </section>

      {r.equilibrium && <EquilibriumReport result={r} sources={await reportSources(actor, data.request)} unit={unit} />}

      <section className="break-inside-avoid">
        <h2 className="mb-1 text-sm font-semibold">Warnings ({r.warnings.length})</h2>
        <WarningList warnings={r.warnings} gas={gas} />
      </section>

      <Caution gas={gas} />
    </article>
  );
}
