import { pagePermission } from "@/lib/pages";
import { CaseBuilder } from "@/components/cases/case-builder";
import { PageHeader } from "@/components/ui/card";
import { getActor } from "@/lib/auth/session";
import { listPinOptions } from "@/lib/services/pins";

export const metadata = { title: "New case" };

export default async function NewCasePage() {
  const actor = pagePermission(await getActor(), "cases.create");
  const options = await listPinOptions(actor);
  return (
    <>
      <PageHeader title="New case" lead="Pick the species and the exact model version of each; approved versions come first. Saving keeps a draft you can evaluate and revise." />
      {options.length === 0 && <p className="mb-4 text-sm text-flag-700">The library has no model versions yet: ask a steward to load the reference library.</p>}
      <CaseBuilder options={options} />
    </>
  );
}
