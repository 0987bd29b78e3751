"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { sendJson, settle } from "@/lib/api/client";

/** Submit for review (after a confirmation: it freezes a snapshot), or re-run onto newer approved versions. */
export function CaseActions({
  caseId,
  lockVersion,
  canSubmit,
  canRerun,
  status,
  nextRevision,
}: {
  caseId: number;
  lockVersion: number;
  canSubmit: boolean;
  canRerun: boolean;
  status: string;
  /** The revision a submission would freeze. */
  nextRevision?: number;
}) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [confirming, setConfirming] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  async function go(path: "submit" | "rerun") {
    setBusy(true);
    setMessage(null);
    const answer = await settle(sendJson("POST", `/api/v1/cases/${caseId}/${path}`, { lockVersion }));
    setBusy(false);
    setConfirming(false);
    if (!answer.ok) setMessage(answer.error.message);
    else router.refresh();
  }
  const submitLabel = status === "returned" ? "Resubmit for review" : "Submit for review";
  return (
    <div className="flex flex-col items-end gap-1">
      <div className="flex flex-wrap gap-2">
        {canRerun && (
          <Button variant="secondary" focusableWhenDisabled disabled={busy} onClick={() => go("rerun")} data-testid="rerun">
            {status === "approved" ? "Re-run on newer versions" : "Re-pin newer versions"}
          </Button>
        )}
        {canSubmit && (
          <Button focusableWhenDisabled disabled={busy} onClick={() => setConfirming(true)}>
            {submitLabel}
          </Button>
        )}
      </div>
      {message && (
        <p role="alert" className="text-xs font-medium text-flag-700">
          {message}
        </p>
      )}
      <ConfirmDialog
        open={confirming}
        title={`${submitLabel}?`}
        confirmLabel={status === "returned" ? "Resubmit" : "Submit"}
        busy={busy}
        onConfirm={() => go("submit")}
        onCancel={() => setConfirming(false)}
      >
        <p>
          This freezes {nextRevision ? `revision ${nextRevision}` : "a snapshot"}: the inputs, the pinned model versions and the result, with their hash. The case cannot be edited
          while it waits for review, and reviewers are mailed.
        </p>
      </ConfirmDialog>
    </div>
  );
}
