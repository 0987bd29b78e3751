import "server-only";
import { requirePermission, type Actor } from "@/lib/auth/guards";
import { evaluate, type EvaluateResult } from "@/lib/thermo";

/**
 * Run the engine for a signed-in member. The body is read only after the
 * permission check, so an anonymous caller never gets it parsed. The engine
 * validates the request with its own schema.
 */
export async function runEvaluation(actor: Actor | null, readBody: () => Promise<unknown>): Promise<EvaluateResult> {
  requirePermission(actor, "evaluate.run");
  return evaluate(await readBody());
}
