import { spawnSync } from "node:child_process";
import { QueryTypes } from "sequelize";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { claimDueMail, enqueueMail } from "@/lib/services/mail";
import { closeDb, models, registry } from "@/lib/db";
import { freshDatabase, isPostgres } from "../helpers/db";

// Only under `npm run test:postgres`: on SQLite there is no server to configure by URL.
beforeAll(async () => {
  if (isPostgres) await freshDatabase();
});
afterAll(() => closeDb());

const cli = (...args: string[]) => spawnSync("node_modules/.bin/tsx", ["scripts/db.ts", ...args], { env: { ...process.env }, encoding: "utf8" });

describe.runIf(isPostgres)("PostgreSQL by configuration (npm run test:postgres only)", () => {
  it("is the postgres dialect, talking to a PostgreSQL server", async () => {
    const { sequelize } = registry();
    expect(sequelize.getDialect()).toBe("postgres");
    const [row] = await sequelize.query<{ version: string }>("SELECT version() AS version", { type: QueryTypes.SELECT });
    expect(row.version).toMatch(/^PostgreSQL \d+/);
  });

  it("npm run db:migrate finds nothing pending and db:seed repeats safely, by DATABASE_URL alone", async () => {
    const teams = await models().Team.count();
    const migrate = cli("migrate");
    expect(migrate.stderr).toBe("");
    expect(migrate.stdout).toContain("migrations: up to date");
    const seed = cli("seed");
    expect(seed.status).toBe(0);
    expect(await models().Team.count()).toBe(teams);
  });

  it("db:backup and db:restore refuse and point to PostgreSQL's own tools", () => {
    for (const args of [["backup"], ["restore", "/nonexistent.sqlite"]]) {
      const run = cli(...args);
      expect(run.status).toBe(1);
      expect(run.stderr).toMatch(/pg_dump/);
    }
  });

  it("counts come back as numbers, not strings", async () => {
    const { sequelize } = registry();
    expect(typeof (await models().User.count())).toBe("number");
    const [row] = await sequelize.query<{ n: unknown }>("SELECT COUNT(*) AS n FROM users", { type: QueryTypes.SELECT });
    // The driver returns bigint as a string; raw counts go through Number() (tests/helpers/db.ts tableCounts).
    expect(Number(row.n)).toBe(await models().User.count());
  });

  it("parallel mail claims from separate connections never share a message", async () => {
    const { sequelize } = registry();
    await sequelize.transaction(async (transaction) => {
      for (let i = 0; i < 30; i += 1) await enqueueMail(transaction, { to: `pg-${i}@example.test`, subject: `Claim ${i}`, text: "x", kind: "invitation" });
    });
    const claims = await Promise.all(Array.from({ length: 6 }, () => claimDueMail(10)));
    const all = claims.flat();
    expect(new Set(all).size).toBe(all.length);
    expect(all.length).toBeGreaterThanOrEqual(30);
  });
});
