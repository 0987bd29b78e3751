import { env, isProduction } from "@/lib/env";
import { createMailTransport } from "@/lib/mail";
import { startMailCatcher } from "@/lib/mail-catcher";
import { pollingWorker, startPollingWorker } from "@/lib/polling-worker";
import { deliverDueMail, setMailKick } from "@/lib/services/mail";

/**
 * Runs inside each app server process (started from instrumentation.ts) and
 * polls the queue every few seconds; an enqueue wakes it at once. Rows are
 * claimed atomically, so several app servers can each run one.
 */
export async function startMailWorker(options: { intervalMs?: number; catcher?: boolean } = {}): Promise<void> {
  if (pollingWorker("mail")) return;
  if (options.catcher ?? !isProduction) {
    try {
      await startMailCatcher(env.MAIL_CATCHER_PORT);
      console.log(`[heatpath] mail catcher listening on 127.0.0.1:${env.MAIL_CATCHER_PORT}`);
    } catch (error) {
      // Another app process on this machine already runs it; sending still works.
      console.warn(`[heatpath] mail catcher not started: ${(error as Error).message}`);
    }
  }
  const transport = createMailTransport();
  const worker = startPollingWorker("mail", () => deliverDueMail(transport), options.intervalMs ?? 3000);
  setMailKick(worker.kick);
}
