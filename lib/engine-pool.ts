import "server-only";
import path from "node:path";
import { Piscina } from "piscina";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { runTask, type EngineTaskName, type EngineTaskOutcome, type EngineTaskPayload, type EngineTaskResult } from "@/lib/engine-tasks";
import { EngineRefusal } from "@/lib/thermo/errors";
import type { EvaluateResult } from "@/lib/thermo/evaluate";

/**
 * The server's engine runs in a pool of worker threads (piscina), never on the
 * request thread: a long evaluation then holds one worker while the server keeps
 * answering. Each job has a wall-time budget (ENGINE_TIME_LIMIT_MS, counted from
 * when a worker starts it, so neither the queue nor a replacement worker's start-up
 * uses it up); a job over it is refused with 503 `engine-time-limit` and its worker
 * is terminated and replaced.
 * At most ENGINE_QUEUE_LIMIT jobs wait for a free worker; one more is refused with
 * 429 `engine-busy` and Retry-After. Engine refusals come back as the same
 * EngineRefusal (422 with the engine's exact code and message).
 *
 * The CLI and `evaluate()` stay synchronous; only server code uses this module.
 */

export type EngineRunOptions = {
  /** Wall-time budget for this job in ms (default ENGINE_TIME_LIMIT_MS). */
  timeoutMs?: number;
};

/** Seconds a client is asked to wait when the queue is full. */
export const ENGINE_BUSY_RETRY_SECONDS = 5;

/** The worker module; resolved from the project root so the bundler leaves it alone (`next start` and vitest run from there). */
export const ENGINE_WORKER_FILE = path.join(/*turbopackIgnore: true*/ process.cwd(), "lib", "engine-worker.mjs");

type PoolHolder = {
  __heatpathEnginePool?: Piscina;
  __heatpathEngineJobs?: number;
  /** Job id → starts its timer; called when the worker says the job has started. */
  __heatpathEngineStarts?: Map<number, () => void>;
  __heatpathEngineNextId?: number;
};
const holder = globalThis as PoolHolder;

/** One pool per process, kept on globalThis because Next bundles each route separately. */
function starts(): Map<number, () => void> {
  holder.__heatpathEngineStarts ??= new Map();
  return holder.__heatpathEngineStarts;
}

export function enginePool(): Piscina {
  if (holder.__heatpathEnginePool) return holder.__heatpathEnginePool;
  const pool = new Piscina({
    filename: ENGINE_WORKER_FILE,
    // Every thread is started at once and kept: a cold worker takes a second or more to load
    // the engine, which is the wait a small evaluation must not see while a heavy one runs.
    minThreads: env.ENGINE_THREADS,
    maxThreads: env.ENGINE_THREADS,
    // The queue bound is kept by runEngineTask (piscina's maxQueue lets a few more through).
  });
  pool.on("message", (message: { heatpathJobStarted?: number }) => {
    const id = message?.heatpathJobStarted;
    if (typeof id !== "number") return;
    starts().get(id)?.();
    starts().delete(id);
  });
  holder.__heatpathEnginePool = pool;
  return pool;
}

/** Close the pool (tests; a server lets its workers end with the process). */
export async function closeEnginePool(): Promise<void> {
  const pool = holder.__heatpathEnginePool;
  holder.__heatpathEnginePool = undefined;
  holder.__heatpathEngineJobs = 0;
  starts().clear();
  if (pool) await pool.destroy();
}

export const engineTimeLimitError = (ms: number) =>
  new AppError(
    503,
    "engine-time-limit",
    `The computation did not finish within ${formatSeconds(ms)} and was stopped. Ask for fewer temperatures or a simpler Cp expression, or try again when the server is less busy.`,
    { timeLimitMs: ms },
  );

export const engineBusyError = () =>
  new AppError(429, "engine-busy", `The server is busy with other computations. Try again in ${ENGINE_BUSY_RETRY_SECONDS} seconds.`, {
    retryAfterSeconds: ENGINE_BUSY_RETRY_SECONDS,
  });

function formatSeconds(ms: number): string {
  const s = ms / 1000;
  return `${Number.isInteger(s) ? s : s.toFixed(1)} s`;
}

/**
 * Run one named job of lib/engine-tasks.ts on the pool. Resolves with the job's
 * value; rejects with the job's EngineRefusal, `engine-time-limit` (503),
 * `engine-busy` (429), or the worker's unexpected error (500 upstream).
 */
export async function runEngineTask<N extends EngineTaskName>(name: N, payload: EngineTaskPayload<N>, opts: EngineRunOptions = {}): Promise<EngineTaskResult<N>> {
  const timeoutMs = opts.timeoutMs ?? env.ENGINE_TIME_LIMIT_MS;
  const pool = enginePool();
  // Jobs running plus jobs waiting; a worker per thread, then ENGINE_QUEUE_LIMIT places in the queue.
  const jobs = holder.__heatpathEngineJobs ?? 0;
  if (jobs >= pool.options.maxThreads + env.ENGINE_QUEUE_LIMIT) throw engineBusyError();
  holder.__heatpathEngineJobs = jobs + 1;
  const controller = new AbortController();
  const id = (holder.__heatpathEngineNextId = (holder.__heatpathEngineNextId ?? 0) + 1);
  let timedOut = false;
  let timer: ReturnType<typeof setTimeout> | undefined;
  starts().set(id, () => {
    timer = setTimeout(() => {
      timedOut = true;
      // Aborting a running job makes piscina terminate its worker and start a fresh one.
      controller.abort();
    }, timeoutMs);
  });
  let outcome: EngineTaskOutcome;
  try {
    // A payload nested deeper than any request the engine's schemas accept cannot cross to a worker
    // (structured clone recurses and overflows the stack); the engine refuses it by its schema
    // before computing anything, so that refusal is produced here, on this thread.
    outcome = nestedDeeperThan(payload, MAX_PAYLOAD_DEPTH) ? runTask(name, payload) : await pool.run({ id, name, payload }, { signal: controller.signal });
  } catch (error) {
    if (timedOut) throw engineTimeLimitError(timeoutMs);
    throw error;
  } finally {
    clearTimeout(timer);
    starts().delete(id);
    holder.__heatpathEngineJobs = (holder.__heatpathEngineJobs ?? 1) - 1;
  }
  if (!outcome.ok) throw new EngineRefusal(outcome.refusal.code, outcome.refusal.message, outcome.refusal.details);
  return outcome.value as EngineTaskResult<N>;
}

/** Far deeper than any request the engine accepts (its deepest field is a few levels down). */
const MAX_PAYLOAD_DEPTH = 64;

/** Depth-first without recursion, so a 20 000-deep array is measured without overflowing. */
function nestedDeeperThan(value: unknown, limit: number): boolean {
  const stack: [unknown, number][] = [[value, 0]];
  while (stack.length) {
    const [v, depth] = stack.pop()!;
    if (v === null || typeof v !== "object") continue;
    if (depth >= limit) return true;
    for (const child of Object.values(v)) if (child !== null && typeof child === "object") stack.push([child, depth + 1]);
  }
  return false;
}

/** `evaluate(request)` on the pool: the same result or the same refusal, off the request thread. */
export function runEngine(request: unknown, opts?: EngineRunOptions): Promise<EvaluateResult> {
  return runEngineTask("evaluate", request, opts);
}
