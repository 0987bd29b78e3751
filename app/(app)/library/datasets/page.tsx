import Link from "next/link";
import { buttonClass } from "@/components/ui/button";
import { Card, PageHeader } from "@/components/ui/card";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { listDatasets } from "@/lib/services/datasets";

const PHASE: Record<string, string> = { g: "gas (g)", l: "liquid (l)", cr: "solid (cr)" };
const phaseText = (p: string) => PHASE[p] ?? p;

export const metadata = { title: "Datasets" };

const kelvin = (x: number) => Number(x.toFixed(2)).toString();

export default async function DatasetsPage() {
  const actor = requireUser(await getActor());
  const datasets = await listDatasets(actor);
  return (
    <>
      <p className="mb-2 text-sm"><Link href="/library" className="text-frost-700 hover:underline">← Library</Link></p>
      <PageHeader
        title="Measured datasets"
        lead={`Cp measurements uploaded by ${actor.teamName}, stored in SI with the SHA-256 of the file as uploaded. Fitted model versions link back here.`}
        action={can(actor.role, "datasets.upload") ? <Link href="/library/upload" className={buttonClass("primary")}>Upload and fit</Link> : undefined}
      />
      <Card>
        {datasets.length === 0 ? (
          <p className="text-sm text-ink-muted">No datasets yet.</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="min-w-full text-left text-sm" data-testid="dataset-list">
              <thead className="text-xs text-ink-muted">
                <tr>
                  <th className="py-1 pr-3 font-medium">Name</th>
                  <th className="py-1 pr-3 font-medium">Species</th>
                  <th className="py-1 pr-3 font-medium">Phase</th>
                  <th className="py-1 pr-3 text-right font-medium">Points</th>
                  <th className="py-1 pr-3 font-medium">Range (K)</th>
                  <th className="py-1 pr-3 font-medium">Uploaded</th>
                </tr>
              </thead>
              <tbody className="divide-y divide-ink-line">
                {datasets.map((d) => (
                  <tr key={d.id}>
                    <td className="py-1.5 pr-3"><Link className="font-medium underline" href={`/library/datasets/${d.id}`}>{d.name}</Link></td>
                    <td className="py-1.5 pr-3">{d.species ? `${d.species.formula} · ${d.species.displayName}` : "—"}</td>
                    <td className="py-1.5 pr-3">{d.phase ? phaseText(d.phase) : <span className="text-ink-muted">not stated</span>}</td>
                    <td className="py-1.5 pr-3 text-right tabular">{d.pointCount}</td>
                    <td className="whitespace-nowrap py-1.5 pr-3 tabular">{d.rangeK ? `${kelvin(d.rangeK[0])}–${kelvin(d.rangeK[1])}` : "—"}</td>
                    <td className="whitespace-nowrap py-1.5 pr-3 text-xs text-ink-muted">{d.createdAt.slice(0, 10)}{d.uploadedByName ? ` · ${d.uploadedByName}` : ""}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </Card>
    </>
  );
}
