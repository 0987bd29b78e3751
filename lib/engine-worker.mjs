/**
 * One engine worker thread of the pool in lib/engine-pool.ts (piscina). The engine is
 * TypeScript; tsx's scoped loader compiles lib/engine-tasks.ts and lib/thermo on load,
 * the same way the CLI (`npm run evaluate`) runs them, so `next start`, `next dev` and
 * vitest all run the one source without a separate build step.
 */
import { tsImport } from "tsx/esm/api";

const tasks = await tsImport("./engine-tasks.ts", import.meta.url);

/** piscina calls this with `{ name, payload }` and sends the return value back. */
export default function run({ name, payload }) {
  return tasks.runTask(name, payload);
}
