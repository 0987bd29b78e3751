/**
 * A background loop inside an app server process: runs `run` every `intervalMs`, and at once
 * when kicked. A kick during a run makes it run again as soon as it ends, so nothing queued
 * meanwhile waits for the next tick. The state lives on globalThis under the worker's name, so
 * a module reloaded in development does not start a second loop.
 */
export interface PollingWorker {
  /** Run now (or again right after the current run). */
  kick(): void;
  /** Stop the timer; a run in progress finishes. */
  stop(): void;
}

type Holder = { [key: symbol]: PollingWorker | undefined };
const keyOf = (name: string) => Symbol.for(`heatpath.${name}.worker`);

/** The worker of that name in this process, if one is running. */
export function pollingWorker(name: string): PollingWorker | undefined {
  return (globalThis as Holder)[keyOf(name)];
}

/** Starts the named worker once per process; a second call returns the running one. */
export function startPollingWorker(name: string, run: () => Promise<unknown>, intervalMs: number): PollingWorker {
  const holder = globalThis as Holder;
  const key = keyOf(name);
  const existing = holder[key];
  if (existing) return existing;
  let running = false;
  let again = false;
  const tick = async () => {
    if (running) {
      again = true;
      return;
    }
    running = true;
    try {
      do {
        again = false;
        await run();
      } while (again);
    } catch (error) {
      console.warn(`[heatpath] ${name} worker: ${(error as Error).message}`);
    } finally {
      running = false;
    }
  };
  const timer = setInterval(tick, intervalMs);
  timer.unref();
  const worker: PollingWorker = {
    kick: () => void tick(),
    stop: () => {
      clearInterval(timer);
      if (holder[key] === worker) holder[key] = undefined;
    },
  };
  holder[key] = worker;
  return worker;
}
