/**
 * One engine worker thread of the pool in lib/engine-pool.ts (piscina). The engine is
 * TypeScript; tsx's scoped loader compiles lib/engine-tasks.ts and lib/thermo on load,
 * the same way the CLI (`npm run evaluate`) runs them, so `next start`, `next dev` and
 * vitest all run the one source without a separate build step.
 */
import { parentPort } from "node:worker_threads";
import { tsImport } from "tsx/esm/api";

const tasks = await tsImport("./engine-tasks.ts", import.meta.url);

/**
 * piscina calls this with `{ id, name, payload }` and sends the return value back. The pool
 * is told first that job `id` has started, which is when its time budget begins.
 */
export default function run({ id, name, payload }) {
  parentPort?.postMessage({ heatpathJobStarted: id });
  return tasks.runTask(name, payload);
}
