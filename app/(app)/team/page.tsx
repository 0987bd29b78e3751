import { InviteForm } from "@/components/team/invite-form";
import { MemberControls } from "@/components/team/member-row";
import { RevokeInvitationButton } from "@/components/team/revoke-button";
import { Badge } from "@/components/ui/badge";
import { Card, PageHeader } from "@/components/ui/card";
import { DataTable, type Column } from "@/components/ui/table";
import { ROLE_LABELS, can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/guards";
import { getActor } from "@/lib/auth/session";
import { isProduction } from "@/lib/env";
import { listInvitations, listMembers } from "@/lib/services/team";
import { changeRoleAction, inviteAction, removeMemberAction, revokeInvitationAction } from "./actions";

export const metadata = { title: "Team" };

const statusTone = { pending: "frost", accepted: "moss", revoked: "neutral", expired: "neutral" } as const;

const INVITATION_COLUMNS: Column<Awaited<ReturnType<typeof listInvitations>>[number]>[] = [
  { key: "email", header: "E-mail", cell: (i) => i.email },
  { key: "role", header: "Role", cell: (i) => ROLE_LABELS[i.role] },
  { key: "status", header: "Status", cell: (i) => <Badge tone={statusTone[i.status]}>{i.status}</Badge> },
  { key: "expires", header: "Expires", className: "tabular text-ink-muted", cell: (i) => i.expiresAt.slice(0, 10) },
  { key: "revoke", header: null, align: "right", cell: (i) => i.status === "pending" && <RevokeInvitationButton invitationId={i.id} revoke={revokeInvitationAction} /> },
];

export default async function TeamPage() {
  const actor = requireUser(await getActor());
  const manage = can(actor.role, "members.manage");
  const [members, invitations] = await Promise.all([listMembers(actor), manage ? listInvitations(actor) : Promise.resolve([])]);
  return (
    <>
      <PageHeader
        title={actor.teamName}
        lead={manage ? "Members, roles and invitations. Every change is written to the audit trail." : "The people in your team and their roles."}
      />
      <div className="space-y-6">
        <Card title={`Members (${members.length})`}>
          <ul className="divide-y divide-ink-line">
            {members.map((m) => (
              <li key={m.id} className="flex flex-wrap items-center justify-between gap-3 py-3" data-testid="member-row">
                <div>
                  <p className="text-sm font-medium">
                    {m.name}
                    {m.userId === actor.userId && <span className="text-ink-muted"> (you)</span>}
                  </p>
                  <p className="text-xs text-ink-muted">{m.email}</p>
                </div>
                {manage ? (
                  <MemberControls membershipId={m.id} role={m.role} name={m.name} changeRole={changeRoleAction} removeMember={removeMemberAction} />
                ) : (
                  <Badge>{ROLE_LABELS[m.role]}</Badge>
                )}
              </li>
            ))}
          </ul>
        </Card>
        {manage && (
          <Card title="Invite someone">
            <InviteForm demo={!isProduction} invite={inviteAction} />
            {invitations.length > 0 && <DataTable className="mt-6" caption="Invitations" columns={INVITATION_COLUMNS} rows={invitations} rowKey={(i) => i.id} />}
          </Card>
        )}
      </div>
    </>
  );
}
