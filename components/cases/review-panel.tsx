"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { inputClass } from "@/components/ui/field";
import { sendJson, settle } from "@/lib/api/client";

/**
 * Approve or return the revision on screen. Nothing is preselected; a return needs a reason,
 * an approval may carry a note; either is confirmed in a dialog before it is recorded.
 */
export function ReviewPanel({ caseId, revision, title, authorName }: { caseId: number; revision: number; title?: string; authorName?: string }) {
  const router = useRouter();
  const [decision, setDecision] = useState<"approved" | "returned" | null>(null);
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [confirming, setConfirming] = useState(false);
  function ask(e: React.FormEvent) {
    e.preventDefault();
    if (decision === null) {
      setError("Choose whether to approve the case or return it to the author.");
      return;
    }
    if (decision === "returned" && reason.trim().length < 5) {
      setError("Say what needs to change (at least 5 characters).");
      return;
    }
    setError(null);
    setConfirming(true);
  }
  async function decide() {
    if (decision === null) return;
    setBusy(true);
    setError(null);
    const answer = await settle(sendJson("POST", `/api/v1/cases/${caseId}/reviews`, { decision, reason, revision }));
    setBusy(false);
    setConfirming(false);
    if (!answer.ok) setError(answer.error.fields?.reason ?? answer.error.message);
    else router.refresh();
  }
  const approving = decision === "approved";
  return (
    <form onSubmit={ask} className="space-y-3" aria-label="Review decision" noValidate>
      <p className="text-sm text-ink-soft">
        Deciding revision <strong>{revision}</strong>. Compare the solid corrected curve with the dashed naive one and check the warnings before you sign off.
      </p>
      <fieldset className="flex flex-wrap gap-4 text-sm">
        <legend className="sr-only">Decision</legend>
        <label className="flex items-center gap-2">
          <input
            type="radio"
            name="decision"
            value="approved"
            checked={decision === "approved"}
            onChange={() => {
              setDecision("approved");
              setError(null);
            }}
          />{" "}
          Approve
        </label>
        <label className="flex items-center gap-2">
          <input
            type="radio"
            name="decision"
            value="returned"
            checked={decision === "returned"}
            onChange={() => {
              setDecision("returned");
              setError(null);
            }}
          />{" "}
          Return to the author
        </label>
      </fieldset>
      <div className="space-y-1">
        <label htmlFor="review-reason" className="block text-sm font-medium text-ink-soft">
          {decision === "returned" ? "Reason (required)" : decision === "approved" ? "Note for the record (optional)" : "Reason or note"}
        </label>
        <textarea
          id="review-reason"
          className={inputClass}
          rows={3}
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? "review-reason-error" : undefined}
        />
        {error && (
          <p id="review-reason-error" role="alert" className="text-xs font-medium text-flag-700">
            {error}
          </p>
        )}
      </div>
      <Button type="submit" variant={decision === "returned" ? "danger" : "primary"} disabled={busy}>
        {decision === "returned" ? "Return case…" : decision === "approved" ? "Approve case…" : "Record decision…"}
      </Button>
      <ConfirmDialog
        open={confirming}
        title={approving ? `Approve revision ${revision}?` : `Return revision ${revision} to the author?`}
        confirmLabel={approving ? "Approve" : "Return"}
        tone={approving ? "primary" : "danger"}
        busy={busy}
        onConfirm={() => void decide()}
        onCancel={() => setConfirming(false)}
      >
        <p>
          {title ? (
            <>
              “{title}”{authorName ? ` by ${authorName}` : ""}.{" "}
            </>
          ) : null}
          {approving
            ? "Your name, the time and the snapshot hash are recorded as the sign-off; an approved revision can never change."
            : "The author is mailed the reason and can revise and resubmit; this revision stays readable."}
        </p>
        <p className="whitespace-pre-wrap" data-testid="confirm-reason">
          {reason.trim() ? `${approving ? "Note" : "Reason"}: ${reason.trim()}` : approving ? "No note." : ""}
        </p>
      </ConfirmDialog>
    </form>
  );
}
