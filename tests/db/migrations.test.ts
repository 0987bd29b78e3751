import { QueryTypes } from "sequelize";
import { afterAll, describe, expect, it } from "vitest";
import { closeDb, registry } from "@/lib/db";
import { migrateDownAll, migrator } from "@/lib/migrate";
import { freshDatabase, isPostgres, isSqlite } from "../helpers/db";

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

describe("database connections", () => {
  // PRAGMAs are SQLite's; PostgreSQL has no journal mode or busy timeout to check.
  it.runIf(isSqlite)("use WAL, foreign keys and a busy timeout on every connection, including transaction ones (SQLite only)", async () => {
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

  it.runIf(isPostgres)("run managed transactions SERIALIZABLE on PostgreSQL, so another app server's race is retried", async () => {
    const { sequelize } = registry();
    await sequelize.transaction(async (transaction) => {
      const [row] = await sequelize.query<{ transaction_isolation: string }>("SHOW transaction_isolation", { transaction, type: QueryTypes.SELECT });
      expect(row.transaction_isolation).toBe("serializable");
    });
  });

  it("queue concurrent write transactions instead of failing (SQLITE_BUSY, serialization failures)", async () => {
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
    await expect(models.Membership.create({ teamId: 99999, userId: 99999, role: "engineer" })).rejects.toThrow(/FOREIGN KEY|foreign key constraint/);
  });
});

describe("model version immutability in the database", () => {
  async function version(status: string) {
    const { models } = registry();
    const species = await models.Species.create({ teamId: null, formula: "N2", displayName: "Nitrogen", elements: { N: 2 }, molarMassGPerMol: 28.0134, identifiers: null });
    const model = await models.CpModel.create({ speciesId: species.id, teamId: null, name: "N2, constant", family: "test", copiedFromId: null, createdById: null });
    return models.ModelVersion.create({
      modelId: model.id,
      teamId: null,
      versionNumber: 1,
      status: status as "approved",
      data: { segments: [{ phase: "g", form: "constant", tminK: 200, tmaxK: 1000, coeffs: { cpJ: 29.1 } }] },
      citation: "test",
      uncertainty: null,
      changeNote: null,
      decisionReason: null,
      datasetId: null,
      authorId: null,
      decidedById: null,
      proposedAt: null,
      decidedAt: null,
    });
  }

  // Sequelize reports RAISE(ABORT) as a constraint error; the trigger's words are on the driver's error.
  const refusal = (pattern: RegExp) => (e: unknown) => pattern.test(String((e as { parent?: Error }).parent?.message ?? e));

  it("refuses any change to an approved version but approved → superseded", async () => {
    const { sequelize } = registry();
    const v = await version("approved");
    await expect(sequelize.query(`UPDATE model_versions SET citation = 'changed' WHERE id = ${v.id}`)).rejects.toSatisfy(refusal(/immutable/));
    await expect(sequelize.query(`UPDATE model_versions SET status = 'draft' WHERE id = ${v.id}`)).rejects.toSatisfy(refusal(/immutable/));
    await expect(sequelize.query(`UPDATE model_versions SET status = 'superseded', citation = 'sneaky' WHERE id = ${v.id}`)).rejects.toSatisfy(refusal(/immutable/));
    await expect(sequelize.query(`DELETE FROM model_versions WHERE id = ${v.id}`)).rejects.toSatisfy(refusal(/cannot be deleted/));
    await sequelize.query(`UPDATE model_versions SET status = 'superseded', updated_at = CURRENT_TIMESTAMP WHERE id = ${v.id}`);
    await expect(sequelize.query(`UPDATE model_versions SET status = 'approved' WHERE id = ${v.id}`)).rejects.toSatisfy(refusal(/immutable/));
  });

  it("lets a draft change freely", async () => {
    const { sequelize } = registry();
    const v = await version("draft");
    await sequelize.query(`UPDATE model_versions SET citation = 'edited', lock_version = lock_version + 1 WHERE id = ${v.id}`);
    const [edited] = await sequelize.query<{ citation: string }>(`SELECT citation FROM model_versions WHERE id = ${v.id}`, { type: QueryTypes.SELECT });
    expect(edited.citation).toBe("edited");
    await sequelize.query(`DELETE FROM model_versions WHERE id = ${v.id}`);
    const left = await sequelize.query(`SELECT id FROM model_versions WHERE id = ${v.id}`, { type: QueryTypes.SELECT });
    expect(left).toEqual([]);
  });
});
