import { orNotFound, pageId, pagePermission } from "@/lib/pages";
import { redirect } from "next/navigation";
import { CaseBuilder } from "@/components/cases/case-builder";
import { PageHeader } from "@/components/ui/card";
import { getActor } from "@/lib/auth/session";
import { getCase } from "@/lib/services/cases";
import { listPinOptions } from "@/lib/services/pins";

export const metadata = { title: "Edit case" };

export default async function EditCasePage({ params }: { params: Promise<{ id: string }> }) {
  const actor = pagePermission(await getActor(), "cases.create");
  const id = await pageId(params);
  const c = await orNotFound(getCase(actor, id));
  if (!c.can.edit) redirect(`/cases/${id}`);
  const options = await listPinOptions(actor);
  // A kept pin may have been superseded since; it stays selectable for this case.
  const known = new Set(options.map((o) => o.versionId));
  const kept = c.pins
    .filter((p) => !known.has(p.versionId))
    .map((p) => ({
      versionId: p.versionId,
      formula: p.formula,
      speciesName: p.speciesName,
      modelName: p.modelName,
      versionNumber: p.versionNumber,
      status: p.status,
      phases: p.phase ? [p.phase] : [],
      tminK: NaN,
      tmaxK: NaN,
      warning: p.status === "approved" ? null : `This version is ${p.status}.`,
    }));
  return (
    <>
      <PageHeader
        title={`Edit: ${c.title}`}
        lead={
          c.status === "returned"
            ? "Revise the case, then resubmit it: the returned snapshot stays readable."
            : "Changes are saved to the draft; nothing is frozen until you submit."
        }
      />
      <CaseBuilder options={[...options, ...kept]} initial={{ id: c.id, lockVersion: c.lockVersion, title: c.title, notes: c.notes, inputs: c.inputs }} />
    </>
  );
}
