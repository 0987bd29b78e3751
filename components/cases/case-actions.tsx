"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { sendJson } from "@/lib/cases/client";

/** Submit for review, or re-run onto newer approved versions. */
export function CaseActions({ caseId, lockVersion, canSubmit, canRerun, status }: { caseId: number; lockVersion: number; canSubmit: boolean; canRerun: boolean; status: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  async function go(path: "submit" | "rerun") {
    setBusy(true);
    setMessage(null);
    const answer = await sendJson("POST", `/api/v1/cases/${caseId}/${path}`, { lockVersion });
    setBusy(false);
    if (!answer.ok) setMessage(answer.error.message);
    else router.refresh();
  }
  return (
    <div className="flex flex-col items-end gap-1">
      <div className="flex flex-wrap gap-2">
        {canRerun && (
          <Button variant="secondary" focusableWhenDisabled disabled={busy} onClick={() => go("rerun")} data-testid="rerun">
            {status === "approved" ? "Re-run on newer versions" : "Re-pin newer versions"}
          </Button>
        )}
        {canSubmit && (
          <Button focusableWhenDisabled disabled={busy} onClick={() => go("submit")}>
            {status === "returned" ? "Resubmit for review" : "Submit for review"}
          </Button>
        )}
      </div>
      {message && (
        <p role="alert" className="text-xs font-medium text-flag-700">
          {message}
        </p>
      )}
    </div>
  );
}
