import Link from "next/link";
import { PointsChart } from "@/components/charts/residual-chart";
import { StatusBadge } from "@/components/library/status-badge";
import { Card, PageHeader } from "@/components/ui/card";
import { DataTable } from "@/components/ui/table";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { orNotFound, pageId } from "@/lib/pages";
import { datasetVersions, getDataset } from "@/lib/services/datasets";
import { CP_UNIT_LABELS, T_UNIT_LABELS } from "@/lib/validation/library";

const PHASE: Record<string, string> = { g: "gas (g)", l: "liquid (l)", cr: "solid (cr)" };
const phaseText = (p: string) => PHASE[p] ?? p;

export const metadata = { title: "Dataset" };

const unitLabel = (labels: Record<string, string>, u: string) => labels[u] ?? u;

export default async function DatasetPage({ params }: { params: Promise<{ id: string }> }) {
  const actor = requireUser(await getActor());
  const id = await pageId(params);
  const d = await orNotFound(getDataset(actor, id));
  const versions = await datasetVersions(actor, id);
  const hasSigma = d.points.some((p) => p.sigmaJ !== undefined);
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href="/library/datasets" className="text-frost-700 hover:underline">
          ← Datasets
        </Link>
      </p>
      <PageHeader title={d.name} lead={d.species ? `${d.species.formula} · ${d.species.displayName}` : "No species named"} />
      <div className="grid gap-6 lg:grid-cols-[1fr_22rem]">
        <div className="space-y-6">
          <Card title={`Measured Cp (${d.pointCount} points)`}>
            <PointsChart
              points={d.points.map((p) => ({ x: p.tK, y: p.cpJ }))}
              pointsName="measured"
              xLabel="T (K)"
              yLabel="Cp (J/(mol·K))"
              testId="dataset-chart"
              ariaLabel="Measured heat capacity against temperature"
            />
          </Card>
          <Card title="Points (SI, as stored)">
            <div className="max-h-96 overflow-auto">
              <DataTable
                look="compact"
                stickyHeader
                testId="dataset-points"
                columns={[
                  { key: "n", header: "#", className: "text-ink-muted", cell: (_, i) => i + 1 },
                  { key: "t", header: "T (K)", cell: (p) => Number(p.tK.toFixed(4)) },
                  { key: "cp", header: "Cp (J/(mol·K))", cell: (p) => Number(p.cpJ.toFixed(4)) },
                  hasSigma && { key: "sigma", header: "σ (J/(mol·K))", cell: (p) => p.sigmaJ ?? "" },
                ]}
                rows={d.points}
                rowKey={(_, i) => i}
              />
            </div>
          </Card>
        </div>
        <div className="space-y-6">
          <Card title="Record">
            <dl className="space-y-1 text-sm" data-testid="dataset-record">
              <div className="flex justify-between gap-2">
                <dt className="text-ink-muted">Phase measured</dt>
                <dd>{d.phase ? phaseText(d.phase) : "not stated"}</dd>
              </div>
              <div className="flex justify-between gap-2">
                <dt className="text-ink-muted">Range</dt>
                <dd className="tabular">{d.rangeK ? `${d.rangeK[0]}–${d.rangeK[1]} K` : "—"}</dd>
              </div>
              <div className="flex justify-between gap-2">
                <dt className="text-ink-muted">Units as uploaded</dt>
                <dd>
                  T in {unitLabel(T_UNIT_LABELS, d.tUnit)}, Cp in {unitLabel(CP_UNIT_LABELS, d.cpUnit)}
                </dd>
              </div>
              <div className="flex justify-between gap-2">
                <dt className="text-ink-muted">File</dt>
                <dd className="break-all text-right">
                  {d.originalFilename ?? "pasted"} · {(d.sizeBytes / 1024).toFixed(1)} KiB
                </dd>
              </div>
              <div className="flex justify-between gap-2">
                <dt className="text-ink-muted">Uploaded</dt>
                <dd>
                  {d.createdAt.slice(0, 16).replace("T", " ")} UTC{d.uploadedByName ? `, ${d.uploadedByName}` : ""}
                </dd>
              </div>
            </dl>
            <p className="mt-2 text-xs text-ink-muted">SHA-256 of the uploaded text</p>
            <code className="block break-all text-xs">{d.sha256}</code>
          </Card>
          <Card title={`Model versions fitted to it (${versions.length})`}>
            {versions.length === 0 ? (
              <p className="text-sm text-ink-muted">None yet.</p>
            ) : (
              <ul className="space-y-2 text-sm">
                {versions.map((v) => (
                  <li key={v.id} className="flex flex-wrap items-center gap-2">
                    <Link className="underline" href={`/library/versions/${v.id}`}>
                      {v.modelName} · v{v.versionNumber}
                    </Link>{" "}
                    <StatusBadge status={v.status} />
                  </li>
                ))}
              </ul>
            )}
          </Card>
        </div>
      </div>
    </>
  );
}
