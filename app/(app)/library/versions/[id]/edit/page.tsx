import { orNotFound, pageId } from "@/lib/pages";
import Link from "next/link";
import { redirect } from "next/navigation";
import { VersionEditor } from "@/components/library/version-editor";
import { PageHeader } from "@/components/ui/card";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { getVersion } from "@/lib/services/library";

export const metadata = { title: "Edit draft" };

export default async function EditVersionPage({ params }: { params: Promise<{ id: string }> }) {
  const actor = requireUser(await getActor());
  const id = await pageId(params);
  const v = await orNotFound(getVersion(actor, id));
  const mayEdit = v.scope === "team" && v.status === "draft" && (v.authorId === actor.userId ? can(actor.role, "models.draft") : can(actor.role, "models.edit"));
  if (!mayEdit) redirect(`/library/versions/${id}`);
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href={`/library/versions/${id}`} className="text-frost-700 hover:underline">
          ← Back to the version
        </Link>
      </p>
      <PageHeader
        title={`Edit ${v.model.name}, version ${v.versionNumber}`}
        lead="Changes are saved to this draft only. If a colleague saved it after you opened it, you will see their version before anything is overwritten."
      />
      <VersionEditor existing={{ id: v.id, lockVersion: v.lockVersion, data: v.data, citation: v.citation, changeNote: v.changeNote }} />
    </>
  );
}
