/**
 * Runs once when an app server starts: refuse an unsafe production setup,
 * then start the mail worker (and, in demo mode, the local mail catcher) and the impact worker.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { isProduction, productionConfigProblems } = await import("@/lib/env");
  const problems = productionConfigProblems();
  if (isProduction) {
    const { models } = await import("@/lib/db");
    const demo = await models().User.count({ where: { isDemo: true } });
    if (demo > 0) problems.push(`${demo} demo account(s) are present`);
  }
  if (problems.length) throw new Error(`Production mode refused: ${problems.join("; ")}.`);
  const { startMailWorker } = await import("@/lib/mail-worker");
  await startMailWorker();
  // Impact runs of a model change on every pinned case, off the request path.
  const { startImpactWorker } = await import("@/lib/impact-worker");
  await startImpactWorker();
}
