"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { inputClass } from "@/components/ui/field";
import type { ActionState, FormAction } from "@/lib/actions";
import { sendJson, settle } from "@/lib/api/client";

type Allowed = { edit: boolean; propose: boolean; decide: boolean; newDraft: boolean; copy: boolean; ownWork: boolean; withdraw?: boolean; remove?: boolean };

/** The workflow buttons the server said this person may use; the server checks again on every call. */
/** `decisions`: the page's approve and reject server actions. */
export function VersionActions({
  versionId,
  modelId,
  allowed,
  label,
  speciesHref,
  decisions,
}: {
  versionId: number;
  modelId: number;
  allowed: Allowed;
  label?: string;
  speciesHref?: string;
  decisions: { approve: FormAction; reject: FormAction };
}) {
  const router = useRouter();
  const [busy, setBusy] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [reason, setReason] = useState("");
  const [rejecting, setRejecting] = useState(false);
  const [confirm, setConfirm] = useState<"withdraw" | "delete" | null>(null);

  const remove = async () => {
    setBusy("delete");
    setError(null);
    const answer = await settle(sendJson("DELETE", `/api/v1/versions/${versionId}`));
    setBusy(null);
    setConfirm(null);
    if (!answer.ok) return setError(answer.error.message);
    router.push(speciesHref ?? "/library");
    router.refresh();
  };

  const run = async (what: string, url: string, body?: unknown, go?: (id: number) => string) => {
    setBusy(what);
    setError(null);
    const answer = await settle(sendJson<{ version?: { id: number } }>("POST", url, body));
    setBusy(null);
    if (!answer.ok) return setError(answer.error.message);
    if (go && answer.data?.version) router.push(go(answer.data.version.id));
    else router.refresh();
  };

  // Decisions go through server actions; the service checks the four-eyes rule either way.
  const decide = async (what: string, action: (prev: ActionState, form: FormData) => Promise<ActionState>, fields: Record<string, string>) => {
    setBusy(what);
    setError(null);
    const form = new FormData();
    form.set("versionId", String(versionId));
    for (const [k, v] of Object.entries(fields)) form.set(k, v);
    const state = await action({ ok: false }, form);
    setBusy(null);
    if (!state.ok) return setError(state.message ?? Object.values(state.fieldErrors ?? {})[0] ?? "That did not work.");
    router.refresh();
  };

  return (
    <div className="space-y-3" data-testid="version-actions">
      <div className="flex flex-wrap gap-2">
        {allowed.edit && (
          <Button variant="secondary" onClick={() => router.push(`/library/versions/${versionId}/edit`)}>
            Edit draft
          </Button>
        )}
        {allowed.propose && (
          <Button focusableWhenDisabled disabled={!!busy} onClick={() => run("propose", `/api/v1/versions/${versionId}/propose`)}>
            {busy === "propose" ? "Proposing…" : "Propose for approval"}
          </Button>
        )}
        {allowed.decide && (
          <>
            <Button focusableWhenDisabled disabled={!!busy} onClick={() => decide("approve", decisions.approve, {})}>
              {busy === "approve" ? "Approving…" : "Approve"}
            </Button>
            <Button variant="danger" focusableWhenDisabled disabled={!!busy} onClick={() => setRejecting((r) => !r)}>
              Reject…
            </Button>
          </>
        )}
        {allowed.withdraw && (
          <Button variant="secondary" focusableWhenDisabled disabled={!!busy} onClick={() => setConfirm("withdraw")}>
            Withdraw proposal
          </Button>
        )}
        {allowed.remove && (
          <Button variant="danger" focusableWhenDisabled disabled={!!busy} onClick={() => setConfirm("delete")}>
            Delete…
          </Button>
        )}
        {allowed.newDraft && (
          <Button
            variant="secondary"
            focusableWhenDisabled
            disabled={!!busy}
            onClick={() => run("draft", `/api/v1/models/${modelId}/versions`, { fromVersionId: versionId }, (id) => `/library/versions/${id}/edit`)}
          >
            New draft from this version
          </Button>
        )}
        {allowed.copy && (
          <Button
            variant="secondary"
            focusableWhenDisabled
            disabled={!!busy}
            onClick={() => run("copy", `/api/v1/versions/${versionId}/copy`, undefined, (id) => `/library/versions/${id}/edit`)}
          >
            {busy === "copy" ? "Copying…" : "Copy into a team model"}
          </Button>
        )}
      </div>
      {allowed.ownWork && (
        <p className="text-sm text-ink-muted" data-testid="own-work-note">
          You wrote, changed or proposed this version, so another steward decides on it.
        </p>
      )}
      {rejecting && (
        <form
          className="space-y-2"
          onSubmit={(e) => {
            e.preventDefault();
            decide("reject", decisions.reject, { reason });
          }}
        >
          <label htmlFor="reject-reason" className="block text-sm font-medium text-ink-soft">
            Reason for the author
          </label>
          <textarea id="reject-reason" value={reason} onChange={(e) => setReason(e.target.value)} rows={3} className={inputClass} />
          <Button type="submit" variant="danger" disabled={!!busy}>
            {busy === "reject" ? "Rejecting…" : "Reject with this reason"}
          </Button>
        </form>
      )}
      {error && (
        <p role="alert" className="text-sm text-flag-700">
          {error}
        </p>
      )}
      <ConfirmDialog
        open={confirm !== null}
        title={confirm === "withdraw" ? "Withdraw this proposal?" : "Delete this version?"}
        confirmLabel={confirm === "withdraw" ? "Withdraw" : "Delete"}
        tone={confirm === "withdraw" ? "primary" : "danger"}
        busy={!!busy}
        onCancel={() => setConfirm(null)}
        onConfirm={() => {
          if (confirm === "withdraw") {
            setConfirm(null);
            void run("withdraw", `/api/v1/versions/${versionId}/withdraw`);
          } else void remove();
        }}
      >
        <p>{label ?? "This version"}.</p>
        <p>
          {confirm === "withdraw"
            ? "It leaves the stewards' queue and becomes a draft again that its author can edit and propose later."
            : "It is removed for good (the audit trail keeps a record). A model left without versions is removed with it; a version a case pins cannot be deleted."}
        </p>
      </ConfirmDialog>
    </div>
  );
}
