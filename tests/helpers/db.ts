import fs from "node:fs";
import { closeDb, registry } from "@/lib/db";
import { env } from "@/lib/env";
import { migrateUp } from "@/lib/migrate";
import { runSeeders } from "@/seeders";

/** The dialect this run's tests use: SQLite unless DATABASE_URL is set (`npm run test:postgres`). */
export const dialect: "sqlite" | "postgres" = env.DATABASE_URL ? "postgres" : "sqlite";
export const isSqlite = dialect === "sqlite";
export const isPostgres = dialect === "postgres";

/**
 * A new database for this test file: all migrations up, demo data seeded. On
 * SQLite the file is deleted; on PostgreSQL (this file's own database) the
 * public schema is dropped and made again.
 */
export async function freshDatabase(options: { seed?: boolean } = {}) {
  await closeDb();
  if (isSqlite) for (const suffix of ["", "-wal", "-shm"]) fs.rmSync(env.DATABASE_PATH + suffix, { force: true });
  const { sequelize, models } = registry();
  if (isPostgres) await sequelize.query("DROP SCHEMA public CASCADE; CREATE SCHEMA public;");
  await migrateUp(sequelize);
  if (options.seed !== false) await runSeeders({ sequelize, models }, { demo: true });
  return { sequelize, models };
}

/** Counts of every table, to prove a refused request wrote nothing. */
export async function tableCounts(): Promise<Record<string, number>> {
  const { sequelize } = registry();
  const tables = (await sequelize.getQueryInterface().showAllTables()) as string[];
  const out: Record<string, number> = {};
  for (const t of tables.sort()) {
    const [rows] = await sequelize.query(`SELECT COUNT(*) AS n FROM "${t}"`);
    out[t] = Number((rows as { n: number }[])[0].n);
  }
  return out;
}
