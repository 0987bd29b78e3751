/**
 * Database chores: `tsx scripts/db.ts migrate|rollback|seed|reset|backup [FILE]|restore FILE|check-production`.
 * The same migrations and seeders the tests use.
 */
import { closeDb, registry } from "@/lib/db";
import { env, isProduction } from "@/lib/env";
import { productionProblems } from "@/lib/production";
import path from "node:path";
import { backupDatabase, restoreDatabase } from "@/lib/backup";
import { migrateDownAll, migrator } from "@/lib/migrate";
import { runSeeders } from "@/seeders";

/** db:backup and db:restore copy the SQLite file; PostgreSQL has its own tools. */
const POSTGRES_BACKUP =
  "db:backup and db:restore work on the SQLite file; with DATABASE_URL set, back up PostgreSQL with pg_dump / pg_restore or your DBA's tooling (docs/postgres.md).";

async function main(command: string | undefined) {
  const { sequelize, models } = registry();
  switch (command) {
    case "migrate": {
      const done = await migrator(sequelize).up();
      console.log(done.length ? `migrated: ${done.map((m) => m.name).join(", ")}` : "migrations: up to date");
      break;
    }
    case "rollback": {
      const undone = await migrator(sequelize).down();
      console.log(undone.length ? `rolled back: ${undone.map((m) => m.name).join(", ")}` : "nothing to roll back");
      break;
    }
    case "seed": {
      const ran = await runSeeders({ sequelize, models }, { demo: !isProduction });
      console.log(`seeded: ${ran.join(", ") || "nothing"}${isProduction ? " (production mode: no demo data)" : ""}`);
      break;
    }
    case "reset": {
      if (isProduction) throw new Error("db:reset is refused in production mode.");
      await migrateDownAll(sequelize);
      await migrator(sequelize).up();
      const ran = await runSeeders({ sequelize, models }, { demo: true });
      console.log(`reset ${env.DATABASE_URL ? "the PostgreSQL database" : env.DATABASE_PATH}; seeded: ${ran.join(", ")}`);
      break;
    }
    case "backup": {
      if (env.DATABASE_URL) throw new Error(POSTGRES_BACKUP);
      await closeDb();
      const stamp = new Date().toISOString().replace(/[:.]/g, "-");
      const file = process.argv[3] ?? path.join(path.dirname(env.DATABASE_PATH), "backups", `heatpath-${stamp}.sqlite`);
      const { bytes } = await backupDatabase(path.resolve(env.DATABASE_PATH), path.resolve(file));
      console.log(`backup written: ${file} (${bytes} bytes)`);
      return;
    }
    case "restore": {
      if (env.DATABASE_URL) throw new Error(POSTGRES_BACKUP);
      await closeDb();
      const file = process.argv[3];
      if (!file) throw new Error("usage: npm run db:restore FILE");
      await restoreDatabase(path.resolve(file), path.resolve(env.DATABASE_PATH));
      console.log(`restored ${env.DATABASE_PATH} from ${file}`);
      return;
    }
    case "check-production": {
      const problems = await productionProblems();
      if (problems.length) throw new Error(`Production mode refused: ${problems.join("; ")}.`);
      break;
    }
    default:
      throw new Error("usage: tsx scripts/db.ts migrate|rollback|seed|reset|backup [FILE]|restore FILE|check-production");
  }
}

main(process.argv[2])
  .then(() => closeDb())
  .catch(async (error: unknown) => {
    console.error(error instanceof Error ? error.message : String(error));
    await closeDb().catch(() => undefined);
    process.exit(1);
  });
