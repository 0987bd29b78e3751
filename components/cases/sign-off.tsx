import type { SignOffDto } from "@/lib/services/sign-off";

export const utc = (iso: string) => `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;

/** "Approved by Rory Reviewer, 2026-12-03 09:40 UTC" — the reviewer, never the author. */
export function decisionLine(record: Pick<SignOffDto, "decision" | "caseStatus">): string {
  const d = record.decision;
  if (d) return `${d.decision === "approved" ? "Approved" : "Returned"} by ${d.reviewerName}, ${utc(d.at)}`;
  return record.caseStatus === "submitted" ? "Awaiting review" : "Not decided";
}

/** The printed report's sign-off block: author, reviewer, decision, reason, when, revision, hash, engine. */
export function SignOffRecord({ record }: { record: SignOffDto }) {
  const d = record.decision;
  const row = "grid grid-cols-[9rem_1fr] gap-2 border-b border-ink-line/60 py-1 last:border-0";
  return (
    <section className="break-inside-avoid rounded-md border border-ink p-3 text-xs" data-testid="sign-off" aria-label="Sign-off record">
      <h2 className="mb-1 text-sm font-semibold">Sign-off record</h2>
      <p className={`mb-2 text-sm font-semibold ${d?.decision === "approved" ? "text-moss-700" : d ? "text-flag-700" : ""}`} data-testid="sign-off-status">
        {decisionLine(record)}
      </p>
      <dl>
        <div className={row}>
          <dt className="text-ink-muted">Author</dt>
          <dd data-testid="sign-off-author">{record.authorName}</dd>
        </div>
        <div className={row}>
          <dt className="text-ink-muted">Revision</dt>
          <dd>
            {record.revision}, submitted by {record.submittedByName}, frozen {utc(record.frozenAt)}
          </dd>
        </div>
        <div className={row}>
          <dt className="text-ink-muted">Reviewer</dt>
          <dd data-testid="sign-off-reviewer">{d ? d.reviewerName : "—"}</dd>
        </div>
        <div className={row}>
          <dt className="text-ink-muted">Decision</dt>
          <dd data-testid="sign-off-decision">
            {d ? (d.decision === "approved" ? "Approved" : "Returned to the author") : record.caseStatus === "submitted" ? "Awaiting review" : "—"}
          </dd>
        </div>
        <div className={row}>
          <dt className="text-ink-muted">Reason</dt>
          <dd className="whitespace-pre-wrap" data-testid="sign-off-reason">
            {d ? (d.reason ?? "None given.") : "—"}
          </dd>
        </div>
        <div className={row}>
          <dt className="text-ink-muted">Decided</dt>
          <dd data-testid="sign-off-at">{d ? utc(d.at) : "—"}</dd>
        </div>
        <div className={row}>
          <dt className="text-ink-muted">Snapshot SHA-256</dt>
          <dd>
            <code className="break-all">{record.hash}</code>
          </dd>
        </div>
        <div className={row}>
          <dt className="text-ink-muted">Engine</dt>
          <dd data-testid="sign-off-engine">{record.engineVersion}</dd>
        </div>
      </dl>
    </section>
  );
}

/** Who approved a pinned version, for the pins table of the report. */
export function approverText(pin: SignOffDto["pins"][number] | undefined): string {
  if (!pin) return "—";
  if (pin.scope === "reference") return "published reference set";
  if (pin.approverName) return `${pin.approverName}${pin.approvedAt ? `, ${pin.approvedAt.slice(0, 10)}` : ""}`;
  return `not approved (${pin.statusAtFreeze})`;
}
