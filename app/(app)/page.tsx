import { Badge } from "@/components/ui/badge";
import { Card, PageHeader } from "@/components/ui/card";
import { ROLE_LABELS, can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";

export default async function HomePage() {
  const actor = requireUser(await getActor());
  return (
    <>
      <PageHeader
        title={`Good to see you, ${actor.name.split(" ")[0]}`}
        lead="Heatpath integrates each species' heat capacity from its anchor to your temperature, so ΔG, K and crossover temperatures hold far from 298.15 K."
      />
      <div className="grid gap-4 md:grid-cols-3">
        <Card title="You">
          <dl className="space-y-2 text-sm">
            <div className="flex justify-between gap-2"><dt className="text-ink-muted">Signed in as</dt><dd className="font-medium">{actor.email}</dd></div>
            <div className="flex justify-between gap-2"><dt className="text-ink-muted">Team</dt><dd className="font-medium" data-testid="home-team">{actor.teamName}</dd></div>
            <div className="flex justify-between gap-2"><dt className="text-ink-muted">Role</dt><dd data-testid="home-role"><Badge tone="ember">{ROLE_LABELS[actor.role]}</Badge></dd></div>
          </dl>
        </Card>
        <Card title="What you can do here" className="md:col-span-2">
          <ul className="list-disc space-y-1 pl-5 text-sm text-ink-soft">
            {can(actor.role, "cases.create") && <li>Build cases and run evaluations against the team&apos;s approved Cp models.</li>}
            {can(actor.role, "models.decide") && <li>Maintain the Cp library and approve colleagues&apos; proposed model versions.</li>}
            {can(actor.role, "cases.review") && <li>Compare naive and corrected results on submitted cases and sign them off.</li>}
            {can(actor.role, "members.manage") && <li>Manage members, roles and invitations for {actor.teamName}.</li>}
          </ul>
        </Card>
      </div>
    </>
  );
}
