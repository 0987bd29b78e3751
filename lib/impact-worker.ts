import { startPollingWorker } from "@/lib/polling-worker";
import { requeueStaleImpactJobs, runQueuedImpactJobs, setImpactKick } from "@/lib/services/impact";

/**
 * Runs inside each app server process (started from instrumentation.ts, beside the mail
 * worker): polls for queued impact jobs and runs them one at a time off the request path; a
 * queued job wakes it at once. Jobs are claimed atomically, so several servers may each run one.
 */
export async function startImpactWorker(options: { intervalMs?: number } = {}): Promise<void> {
  await requeueStaleImpactJobs().catch(() => 0);
  const worker = startPollingWorker("impact", runQueuedImpactJobs, options.intervalMs ?? 5000);
  setImpactKick(worker.kick);
}
