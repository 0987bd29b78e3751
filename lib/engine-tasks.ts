/**
 * The jobs the engine worker threads run (lib/engine-worker.mjs loads this file).
 * Pure like the engine itself: no next, react, sequelize or fs, because it runs
 * inside a worker thread. Add a job by adding an entry to `ENGINE_TASKS`; the pool
 * (lib/engine-pool.ts) runs it by name with `runEngineTask(name, payload)`.
 */
import { compareSources, evaluate, EngineRefusal, type EvaluateRequest, type SourceVariant } from "./thermo";
import { inFormat, type ResultFormat } from "./thermo/columns";

export const ENGINE_TASKS = {
  evaluate: (payload: unknown) => evaluate(payload),
  /**
   * The answer of `POST /api/v1/evaluate` as the bytes the route sends: rows or columns, made
   * and serialised here, so neither the result's objects nor their serialisation cost the
   * request thread anything (the worker transfers the bytes; nothing is copied back).
   */
  evaluateJson: (payload: { request: unknown; format?: ResultFormat }) => new TextEncoder().encode(JSON.stringify(inFormat(evaluate(payload.request), payload.format))),
  compareSources: (payload: { request: EvaluateRequest; variants: SourceVariant[] }) => compareSources(payload.request, payload.variants),
};

export type EngineTaskName = keyof typeof ENGINE_TASKS;
export type EngineTaskPayload<N extends EngineTaskName> = Parameters<(typeof ENGINE_TASKS)[N]>[0];
export type EngineTaskResult<N extends EngineTaskName> = ReturnType<(typeof ENGINE_TASKS)[N]>;

/**
 * What crosses the thread boundary: a value, or the engine's refusal as plain data (class instances
 * do not survive structured clone). A value that is a Uint8Array is transferred, not copied
 * (lib/engine-worker.mjs).
 */
export type EngineTaskOutcome = { ok: true; value: unknown } | { ok: false; refusal: { code: string; message: string; details?: unknown } };

export function runTask(name: string, payload: unknown): EngineTaskOutcome {
  if (!Object.prototype.hasOwnProperty.call(ENGINE_TASKS, name)) throw new Error(`unknown engine task "${name}"`);
  try {
    return { ok: true, value: (ENGINE_TASKS[name as EngineTaskName] as (p: unknown) => unknown)(payload) };
  } catch (error) {
    if (error instanceof EngineRefusal) return { ok: false, refusal: error.toJSON() };
    throw error;
  }
}
