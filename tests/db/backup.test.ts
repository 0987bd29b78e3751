import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { backupDatabase, restoreDatabase } from "@/lib/backup";
import { closeDb, models, registry } from "@/lib/db";
import { env } from "@/lib/env";
import { freshDatabase, isSqlite } from "../helpers/db";

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "heatpath-backup-"));

beforeAll(async () => {
  if (isSqlite) await freshDatabase();
});
afterAll(async () => {
  await closeDb();
  fs.rmSync(dir, { recursive: true, force: true });
});

const teams = () => models().Team.count();

// SQLite's online backup API; on PostgreSQL backups are pg_dump or the DBA's own tooling (docs/postgres.md).
describe.runIf(isSqlite)("backup and restore (SQLite only)", () => {
  it("takes a consistent backup while writes go on, and restores it", async () => {
    let writing = true;
    let written = 0;
    const writer = (async () => {
      while (writing) {
        await registry().sequelize.transaction(async (transaction) => {
          await models().Team.create({ name: `Load ${written}`, slug: `load-${written}` }, { transaction });
        });
        written += 1;
      }
    })();
    await new Promise((r) => setTimeout(r, 50));
    const file = path.join(dir, "online.sqlite");
    await backupDatabase(path.resolve(env.DATABASE_PATH), file);
    writing = false;
    await writer;
    expect(written).toBeGreaterThan(0);

    const afterBackup = await teams();
    await closeDb();
    await restoreDatabase(file, path.resolve(env.DATABASE_PATH));
    const restored = await teams();
    // The copy is one point in time during the load: some of the writes, all of them whole.
    expect(restored).toBeLessThanOrEqual(afterBackup);
    expect(restored).toBeGreaterThanOrEqual(2);
    const [check] = (await registry().sequelize.query("PRAGMA integrity_check", { type: "SELECT" })) as { integrity_check: string }[];
    expect(check.integrity_check).toBe("ok");
  });

  it("round-trips through npm run db:backup / db:restore", async () => {
    const before = await teams();
    await closeDb();
    const file = path.join(dir, "cli.sqlite");
    const run = (...args: string[]) => spawnSync("node_modules/.bin/tsx", ["scripts/db.ts", ...args], { env: { ...process.env }, encoding: "utf8" });
    const backup = run("backup", file);
    expect(backup.status).toBe(0);
    expect(backup.stdout).toContain(`backup written: ${file}`);
    await models().Team.create({ name: "After backup", slug: "after-backup" });
    expect(await teams()).toBe(before + 1);
    await closeDb();
    const restore = run("restore", file);
    expect(restore.status).toBe(0);
    expect(await teams()).toBe(before);
  });

  it("refuses a file that is not a Heatpath database, and changes nothing", async () => {
    const bogus = path.join(dir, "bogus.sqlite");
    fs.writeFileSync(bogus, "not a database at all, just text".repeat(100));
    const before = await teams();
    await expect(restoreDatabase(bogus, path.resolve(env.DATABASE_PATH))).rejects.toThrow(/is not a sound SQLite database/);
    expect(await teams()).toBe(before);
  });
});
