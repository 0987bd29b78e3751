import type { SMTPServer } from "smtp-server";
import { env, isProduction } from "@/lib/env";
import { createMailTransport } from "@/lib/mail";
import { startMailCatcher } from "@/lib/mail-catcher";
import { deliverDueMail, setMailKick } from "@/lib/services/mail";

const STATE = Symbol.for("heatpath.mail.worker");
type State = { timer: NodeJS.Timeout; catcher?: SMTPServer; running: boolean; again: boolean };

/**
 * Runs inside each app server process (started from instrumentation.ts) and
 * polls the queue every few seconds; an enqueue wakes it at once. Rows are
 * claimed atomically, so several app servers can each run one.
 */
export async function startMailWorker(options: { intervalMs?: number; catcher?: boolean } = {}): Promise<void> {
  const holder = globalThis as { [STATE]?: State };
  if (holder[STATE]) return;
  let catcher: SMTPServer | undefined;
  if (options.catcher ?? !isProduction) {
    try {
      catcher = await startMailCatcher(env.MAIL_CATCHER_PORT);
      console.log(`[heatpath] mail catcher listening on 127.0.0.1:${env.MAIL_CATCHER_PORT}`);
    } catch (error) {
      // Another app process on this machine already runs it; sending still works.
      console.warn(`[heatpath] mail catcher not started: ${(error as Error).message}`);
    }
  }
  const transport = createMailTransport();
  const state: State = { timer: undefined as unknown as NodeJS.Timeout, catcher, running: false, again: false };
  const tick = async () => {
    if (state.running) {
      state.again = true;
      return;
    }
    state.running = true;
    try {
      do {
        state.again = false;
        await deliverDueMail(transport);
      } while (state.again);
    } catch (error) {
      console.warn(`[heatpath] mail worker: ${(error as Error).message}`);
    } finally {
      state.running = false;
    }
  };
  state.timer = setInterval(tick, options.intervalMs ?? 3000);
  state.timer.unref();
  holder[STATE] = state;
  setMailKick(() => void tick());
}

export async function stopMailWorker(): Promise<void> {
  const holder = globalThis as { [STATE]?: State };
  const state = holder[STATE];
  if (!state) return;
  clearInterval(state.timer);
  setMailKick(undefined);
  holder[STATE] = undefined;
  if (state.catcher) await new Promise<void>((r) => state.catcher!.close(() => r()));
}
