import Link from "next/link";
import { redirect } from "next/navigation";
import { VersionEditor } from "@/components/library/version-editor";
import { PageHeader } from "@/components/ui/card";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { phasesBySpecies } from "@/lib/services/datasets";
import { listSpecies } from "@/lib/services/library";

export const metadata = { title: "New model" };

export default async function NewModelPage() {
  const actor = requireUser(await getActor());
  if (!can(actor.role, "models.draft")) redirect("/library");
  const [species, phases] = await Promise.all([listSpecies(actor, { pageSize: 100 }), phasesBySpecies(actor)]);
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href="/library" className="text-frost-700 hover:underline">
          ← Library
        </Link>
      </p>
      <PageHeader
        title="New team model"
        lead="Type or paste the coefficients of each segment; the curve on the right follows as you type. The draft is saved to your team and can then be proposed for approval."
      />
      <VersionEditor species={species.items.map((s) => ({ id: s.id, formula: s.formula, displayName: s.displayName, phases: phases[s.id] ?? [] }))} />
    </>
  );
}
