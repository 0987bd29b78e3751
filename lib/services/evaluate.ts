import "server-only";
import { requirePermission, type Actor } from "@/lib/auth/guards";
import { runEngineTask } from "@/lib/engine-pool";
import type { ResultFormat } from "@/lib/thermo/columns";

/**
 * Run the engine for a signed-in member and answer with the JSON bytes `POST /api/v1/evaluate`
 * sends (rows, or columns with `format: "columns"`). The body is read only after the
 * permission check, so an anonymous caller never gets it parsed. The engine validates the
 * request with its own schema, builds and serialises the answer in a worker thread of the
 * pool (lib/engine-pool.ts), so neither a long evaluation nor the answer's serialisation
 * holds the request thread; the bytes are handed over, not copied.
 */
export async function runEvaluation(actor: Actor | null, readBody: () => Promise<unknown>, format?: ResultFormat): Promise<Uint8Array<ArrayBuffer>> {
  requirePermission(actor, "evaluate.run");
  return runEngineTask("evaluateJson", { request: await readBody(), format });
}
