/**
 * Runs once when an app server starts: refuse an unsafe production setup,
 * then start the engine's worker threads, the mail worker (and, in demo mode, the local mail
 * catcher) and the impact worker.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  // Requests carry their socket address for the sign-in limits (Next gives handlers no socket).
  const { installPeerAddressHook } = await import("@/lib/auth/peer-address");
  installPeerAddressHook();
  const { productionProblems } = await import("@/lib/production");
  const problems = await productionProblems();
  if (problems.length) throw new Error(`Production mode refused: ${problems.join("; ")}.`);
  const { enginePool } = await import("@/lib/engine-pool");
  enginePool();
  const { startMailWorker } = await import("@/lib/mail-worker");
  await startMailWorker();
  // Impact runs of a model change on every pinned case, off the request path.
  const { startImpactWorker } = await import("@/lib/impact-worker");
  await startImpactWorker();
}
