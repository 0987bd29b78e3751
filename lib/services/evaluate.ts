import "server-only";
import { requirePermission, type Actor } from "@/lib/auth/guards";
import { runEngine } from "@/lib/engine-pool";
import type { EvaluateResult } from "@/lib/thermo";

/**
 * Run the engine for a signed-in member. The body is read only after the
 * permission check, so an anonymous caller never gets it parsed. The engine
 * validates the request with its own schema, in a worker thread of the pool
 * (lib/engine-pool.ts) so a long evaluation never holds the request thread.
 */
export async function runEvaluation(actor: Actor | null, readBody: () => Promise<unknown>): Promise<EvaluateResult> {
  requirePermission(actor, "evaluate.run");
  return runEngine(await readBody());
}
