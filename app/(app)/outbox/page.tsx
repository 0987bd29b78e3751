import { Badge } from "@/components/ui/badge";
import { Card, PageHeader } from "@/components/ui/card";
import { getActor } from "@/lib/auth/session";
import { isProduction } from "@/lib/env";
import { listOutbox } from "@/lib/services/mail";

export const metadata = { title: "Outbox" };

/** Linkify only the app's own links inside a caught message. */
function Body({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/\S+)/g);
  return (
    <pre className="whitespace-pre-wrap break-words font-sans text-sm text-ink-soft">
      {parts.map((p, i) =>
        /^https?:\/\//.test(p) ? (
          <a key={i} href={p} className="text-frost-600 underline">
            {p}
          </a>
        ) : (
          <span key={i}>{p}</span>
        ),
      )}
    </pre>
  );
}

export default async function OutboxPage() {
  const outbox = await listOutbox(await getActor());
  const { queue } = outbox;
  return (
    <>
      <PageHeader
        title="Outbox"
        lead={
          (outbox.scope === "team" ? "Every message this team's own actions sent. " : "Messages this team's actions sent to you. ") +
          (isProduction ? "Delivery status of outgoing messages." : "Demo mode: every message the app sends lands in the local mail catcher on 127.0.0.1 and is shown here.")
        }
      />
      <div className="mb-6 flex flex-wrap gap-2 text-sm" data-testid="queue-counts">
        <Badge tone="frost">{queue.queued} queued</Badge>
        <Badge tone="neutral">{queue.sending} sending</Badge>
        <Badge tone="moss">{queue.sent} sent</Badge>
        <Badge tone={queue.failed ? "flag" : "neutral"}>{queue.failed} failed</Badge>
      </div>
      {outbox.recentFailures.length > 0 && (
        <Card title="Delivery problems" className="mb-6">
          <ul className="space-y-1 text-sm">
            {outbox.recentFailures.map((f) => (
              <li key={f.id}>
                <span className="font-medium">{f.subject}</span> to {f.to.join(", ")}: attempt {f.attempts}, {f.lastError}
              </li>
            ))}
          </ul>
        </Card>
      )}
      {outbox.caught.length === 0 ? (
        <Card>
          <p className="text-sm text-ink-muted">No messages caught yet. Invitations, review requests and model decisions appear here.</p>
        </Card>
      ) : (
        <ol className="space-y-4">
          {outbox.caught.map((m) => (
            <li key={m.id}>
              <article className="rounded-lg border border-ink-line bg-white shadow-card" data-testid="caught-message">
                <header className="border-b border-ink-line px-4 py-3">
                  <h2 className="text-sm font-semibold">{m.subject}</h2>
                  <p className="text-xs text-ink-muted">
                    To {m.to.join(", ")} · <time dateTime={m.receivedAt}>{m.receivedAt.replace("T", " ").slice(0, 19)} UTC</time>
                  </p>
                </header>
                <div className="px-4 py-3">
                  <Body text={m.text} />
                </div>
              </article>
            </li>
          ))}
        </ol>
      )}
    </>
  );
}
