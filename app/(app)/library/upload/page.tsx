import Link from "next/link";
import { redirect } from "next/navigation";
import { UploadWizard } from "@/components/library/upload-wizard";
import { Caution } from "@/components/results/caution";
import { PageHeader } from "@/components/ui/card";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { phasesBySpecies } from "@/lib/services/datasets";
import { listSpecies } from "@/lib/services/library";

export const metadata = { title: "Fit measured data" };

export default async function UploadPage() {
  const actor = requireUser(await getActor());
  if (!can(actor.role, "datasets.upload")) redirect("/library");
  const [species, phases] = await Promise.all([listSpecies(actor, { pageSize: 100 }), phasesBySpecies(actor)]);
  const team = species.items.filter((s) => s.scope === "team");
  const ordered = [...team, ...species.items.filter((s) => s.scope === "reference")];
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href="/library" className="text-frost-700 hover:underline">
          ← Library
        </Link>
      </p>
      <PageHeader
        title="Fit measured data"
        lead={
          can(actor.role, "models.fit")
            ? "Upload measured Cp points, check every row, fit a Cp form by weighted least squares, look at the residuals, and save the fit as a draft model version linked to the data."
            : "Upload measured Cp points for your team; a steward fits them and saves the model."
        }
      />
      <UploadWizard species={ordered.map((s) => ({ id: s.id, formula: s.formula, displayName: s.displayName, phases: phases[s.id] ?? [] }))} />
      <Caution className="mt-6" />
    </>
  );
}
