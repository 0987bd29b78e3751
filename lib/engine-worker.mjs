/**
 * One engine worker thread of the pool in lib/engine-pool.ts (piscina). The engine is
 * TypeScript; tsx's scoped loader compiles lib/engine-tasks.ts and lib/thermo on load,
 * the same way the CLI (`npm run evaluate`) runs them, so `next start`, `next dev` and
 * vitest all run the one source without a separate build step.
 */
import { parentPort } from "node:worker_threads";
import { move, transferableSymbol, valueSymbol } from "piscina";
import { tsImport } from "tsx/esm/api";

const tasks = await tsImport("./engine-tasks.ts", import.meta.url);

/**
 * piscina calls this with `{ id, name, payload }` and sends the return value back. The pool
 * is told first that job `id` has started, which is when its time budget begins. A job whose
 * value is bytes (a serialised answer) hands its buffer over instead of having it copied.
 */
export default function run({ id, name, payload }) {
  parentPort?.postMessage({ heatpathJobStarted: id });
  const outcome = tasks.runTask(name, payload);
  if (!outcome.ok || !(outcome.value instanceof Uint8Array)) return outcome;
  const buffer = outcome.value.buffer;
  return move({
    get [transferableSymbol]() {
      return [buffer];
    },
    get [valueSymbol]() {
      return outcome;
    },
  });
}
