import { Badge } from "@/components/ui/badge";

const TONE = { approved: "moss", proposed: "ember", draft: "frost", rejected: "flag", superseded: "neutral" } as const;
const WORDS = { approved: "Approved", proposed: "Proposed · awaiting approval", draft: "Draft · not approved", rejected: "Rejected", superseded: "Superseded" } as const;

/** A version's status; anything not approved says so plainly. */
export function StatusBadge({ status, short = false }: { status: keyof typeof TONE; short?: boolean }) {
  return (
    <span data-testid="version-status" data-status={status}>
      <Badge tone={TONE[status]}>{short ? status : WORDS[status]}</Badge>
    </span>
  );
}

export function ScopeBadge({ scope }: { scope: "reference" | "team" }) {
  return <Badge tone={scope === "reference" ? "neutral" : "ember"}>{scope === "reference" ? "Reference" : "Team"}</Badge>;
}
