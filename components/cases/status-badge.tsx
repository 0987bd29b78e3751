import { Badge } from "@/components/ui/badge";
import type { CaseStatus } from "@/lib/validation/cases";

const TONE = { draft: "neutral", submitted: "frost", approved: "moss", returned: "flag" } as const;
const WORD: Record<CaseStatus, string> = { draft: "Draft", submitted: "Awaiting review", approved: "Approved", returned: "Returned" };

export function StatusBadge({ status }: { status: CaseStatus }) {
  return (
    <span data-testid="case-status" data-status={status}>
      <Badge tone={TONE[status]}>{WORD[status]}</Badge>
    </span>
  );
}
