import { QueryTypes } from "sequelize";
import { afterAll, describe, expect, it } from "vitest";
import { closeDb, registry } from "@/lib/db";
import { migrateDownAll, migrator } from "@/lib/migrate";
import { freshDatabase } from "../helpers/db";

const FOUNDATION_TABLES = ["audit_events", "invitations", "memberships", "teams", "users"];

afterAll(() => closeDb());

describe("migrations", () => {
  it("run all up, all down, all up again", async () => {
    const { sequelize } = await freshDatabase({ seed: false });
    const qi = sequelize.getQueryInterface();
    const up = (await qi.showAllTables()) as string[];
    for (const t of FOUNDATION_TABLES) expect(up).toContain(t);

    await migrateDownAll(sequelize);
    const down = ((await qi.showAllTables()) as string[]).filter((t) => t !== "SequelizeMeta");
    expect(down).toEqual([]);

    const again = await migrator(sequelize).up();
    expect(again.length).toBeGreaterThanOrEqual(FOUNDATION_TABLES.length);
    expect((await qi.showAllTables()) as string[]).toEqual(expect.arrayContaining(FOUNDATION_TABLES));
  });

  it("leave nothing pending after up", async () => {
    const { sequelize } = registry();
    expect(await migrator(sequelize).pending()).toEqual([]);
  });
});

describe("SQLite connections", () => {
  it("use WAL, foreign keys and a busy timeout on every connection, including transaction ones", async () => {
    const { sequelize } = registry();
    const [mode] = await sequelize.query<{ journal_mode: string }>("PRAGMA journal_mode", { type: QueryTypes.SELECT });
    expect(mode.journal_mode).toBe("wal");
    await sequelize.transaction(async (transaction) => {
      const [fk] = await sequelize.query<{ foreign_keys: number }>("PRAGMA foreign_keys", { transaction, type: QueryTypes.SELECT });
      const [busy] = await sequelize.query<{ timeout: number }>("PRAGMA busy_timeout", { transaction, type: QueryTypes.SELECT });
      expect(fk.foreign_keys).toBe(1);
      expect(busy.timeout).toBeGreaterThanOrEqual(5000);
    });
  });

  it("queue concurrent write transactions instead of failing with SQLITE_BUSY", async () => {
    const { sequelize, models } = registry();
    const team = await models.Team.create({ name: "Concurrency", slug: "concurrency" });
    const results = await Promise.allSettled(
      Array.from({ length: 12 }, (_, i) =>
        sequelize.transaction(async (transaction) => {
          const t = await models.Team.findByPk(team.id, { transaction });
          await new Promise((r) => setTimeout(r, 5));
          await t!.update({ name: `${t!.name}+${i}` }, { transaction });
        }),
      ),
    );
    expect(results.filter((r) => r.status === "rejected")).toEqual([]);
    const final = await models.Team.findByPk(team.id);
    // Every writer saw the previous writer's commit: no lost update.
    expect(final!.name.split("+").length).toBe(13);
  });

  it("enforce foreign keys", async () => {
    const { models } = registry();
    await expect(models.Membership.create({ teamId: 99999, userId: 99999, role: "engineer" })).rejects.toThrow(/FOREIGN KEY/);
  });
});
