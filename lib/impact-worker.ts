import { requeueStaleImpactJobs, runQueuedImpactJobs, setImpactKick } from "@/lib/services/impact";

const STATE = Symbol.for("heatpath.impact.worker");
type State = { timer: NodeJS.Timeout; running: boolean; again: boolean };

/**
 * Runs inside each app server process (started from instrumentation.ts, beside the mail
 * worker): polls for queued impact jobs and runs them one at a time off the request path; a
 * queued job wakes it at once. Jobs are claimed atomically, so several servers may each run one.
 */
export async function startImpactWorker(options: { intervalMs?: number } = {}): Promise<void> {
  const holder = globalThis as { [STATE]?: State };
  if (holder[STATE]) return;
  await requeueStaleImpactJobs().catch(() => 0);
  const state: State = { timer: undefined as unknown as NodeJS.Timeout, running: false, again: false };
  const tick = async () => {
    if (state.running) {
      state.again = true;
      return;
    }
    state.running = true;
    try {
      do {
        state.again = false;
        await runQueuedImpactJobs();
      } while (state.again);
    } catch (error) {
      console.warn(`[heatpath] impact worker: ${(error as Error).message}`);
    } finally {
      state.running = false;
    }
  };
  state.timer = setInterval(tick, options.intervalMs ?? 5000);
  state.timer.unref();
  holder[STATE] = state;
  setImpactKick(() => void tick());
}

export function stopImpactWorker(): void {
  const holder = globalThis as { [STATE]?: State };
  const state = holder[STATE];
  if (!state) return;
  clearInterval(state.timer);
  setImpactKick(undefined);
  holder[STATE] = undefined;
}
