import Link from "next/link";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { DataTable, type Column } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { listDatasets } from "@/lib/services/datasets";

const PHASE: Record<string, string> = { g: "gas (g)", l: "liquid (l)", cr: "solid (cr)" };
const phaseText = (p: string) => PHASE[p] ?? p;

export const metadata = { title: "Datasets" };

const kelvin = (x: number) => Number(x.toFixed(2)).toString();

const COLUMNS: Column<Awaited<ReturnType<typeof listDatasets>>[number]>[] = [
  {
    key: "name",
    header: "Name",
    cell: (d) => (
      <Link className="font-medium underline" href={`/library/datasets/${d.id}`}>
        {d.name}
      </Link>
    ),
  },
  { key: "species", header: "Species", cell: (d) => (d.species ? `${d.species.formula} · ${d.species.displayName}` : "—") },
  { key: "phase", header: "Phase", cell: (d) => (d.phase ? phaseText(d.phase) : <span className="text-ink-muted">not stated</span>) },
  { key: "points", header: "Points", align: "right", cell: (d) => d.pointCount },
  { key: "range", header: "Range (K)", className: "whitespace-nowrap tabular", cell: (d) => (d.rangeK ? `${kelvin(d.rangeK[0])}–${kelvin(d.rangeK[1])}` : "—") },
  {
    key: "uploaded",
    header: "Uploaded",
    className: "whitespace-nowrap text-xs text-ink-muted",
    cell: (d) => `${d.createdAt.slice(0, 10)}${d.uploadedByName ? ` · ${d.uploadedByName}` : ""}`,
  },
];

export default async function DatasetsPage() {
  const actor = requireUser(await getActor());
  const datasets = await listDatasets(actor);
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href="/library" className="text-frost-700 hover:underline">
          ← Library
        </Link>
      </p>
      <PageHeader
        title="Measured datasets"
        lead={`Cp measurements uploaded by ${actor.teamName}, stored in SI with the SHA-256 of the file as uploaded. Fitted model versions link back here.`}
        action={
          can(actor.role, "datasets.upload") ? (
            <Link href="/library/upload" className={buttonClass("primary")}>
              Upload and fit
            </Link>
          ) : undefined
        }
      />
      <Card>
        {datasets.length === 0 ? (
          <p className="text-sm text-ink-muted">No datasets yet.</p>
        ) : (
          <div className="overflow-x-auto">
            <DataTable testId="dataset-list" columns={COLUMNS} rows={datasets} rowKey={(d) => d.id} />
          </div>
        )}
      </Card>
    </>
  );
}
