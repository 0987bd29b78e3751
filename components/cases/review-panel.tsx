"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import { sendJson } from "@/lib/cases/client";

/** Approve or return the revision on screen; a return needs a reason. */
export function ReviewPanel({ caseId, revision }: { caseId: number; revision: number }) {
  const router = useRouter();
  const [decision, setDecision] = useState<"approved" | "returned">("approved");
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function decide(e: React.FormEvent) {
    e.preventDefault();
    if (decision === "returned" && reason.trim().length < 5) {
      setError("Say what needs to change (at least 5 characters).");
      return;
    }
    setBusy(true);
    setError(null);
    const answer = await sendJson("POST", `/api/v1/cases/${caseId}/reviews`, { decision, reason, revision });
    setBusy(false);
    if (!answer.ok) setError(answer.error.fields?.reason ?? answer.error.message);
    else router.refresh();
  }
  return (
    <form onSubmit={decide} className="space-y-3" aria-label="Review decision">
      <p className="text-sm text-ink-soft">
        Deciding revision <strong>{revision}</strong>. Compare the solid corrected curve with the dashed naive one and check the warnings before you sign off.
      </p>
      <fieldset className="flex flex-wrap gap-4 text-sm">
        <legend className="sr-only">Decision</legend>
        <label className="flex items-center gap-2">
          <input type="radio" name="decision" value="approved" checked={decision === "approved"} onChange={() => setDecision("approved")} /> Approve
        </label>
        <label className="flex items-center gap-2">
          <input type="radio" name="decision" value="returned" checked={decision === "returned"} onChange={() => setDecision("returned")} /> Return to the author
        </label>
      </fieldset>
      <div className="space-y-1">
        <label htmlFor="review-reason" className="block text-sm font-medium text-ink-soft">
          Reason {decision === "returned" ? "(required)" : "(optional)"}
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
        {decision === "returned" ? "Return case" : "Approve case"}
      </Button>
    </form>
  );
}
