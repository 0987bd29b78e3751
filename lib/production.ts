import { productionConfigProblems, isProduction } from "@/lib/env";
import { registry } from "@/lib/db";

/**
 * Everything that stops production mode from starting: the configuration, then demo accounts
 * in the database. A database without tables yet (a fresh production start, before the
 * migrations) has no demo accounts, so the check never needs the schema to exist.
 * Used by `npm start` (scripts/db.ts check-production) and by every app server (instrumentation.ts).
 */
export async function productionProblems(): Promise<string[]> {
  const problems = productionConfigProblems();
  if (!isProduction) return problems;
  const { sequelize, models } = registry();
  if (await sequelize.getQueryInterface().tableExists("users")) {
    const demo = await models.User.count({ where: { isDemo: true } });
    if (demo > 0) problems.push(`${demo} demo account(s) are present; remove them before running in production mode`);
  }
  return problems;
}
