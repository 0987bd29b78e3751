/** The contributors migration fills existing versions from their authors and the audit trail. */
import { afterAll, describe, expect, it } from "vitest";
import { closeDb, models, registry } from "@/lib/db";
import { migrator } from "@/lib/migrate";
import { DEMO_MODEL_NAME } from "@/seeders/03-demo-library";
import { freshDatabase } from "../helpers/db";

afterAll(() => closeDb());

describe("model_version_contributors backfill", () => {
  it("records the author and every editor and proposer named in the audit trail", async () => {
    await freshDatabase();
    const { sequelize } = registry();
    // Back to before the table existed, with the seeded versions and their audit events in place.
    await migrator(sequelize).down({ to: "20261203-TA03-create-model-version-contributors.cjs" });
    const sam = await models().User.findOne({ where: { email: "sam.steward@example.test" } });
    const stella = await models().User.findOne({ where: { email: "stella.steward@example.test" } });
    const model = await models().CpModel.findOne({ where: { name: DEMO_MODEL_NAME } });
    const v2 = await models().ModelVersion.findOne({ where: { modelId: model!.id, versionNumber: 2 } });
    await models().AuditEvent.create({
      teamId: v2!.teamId,
      actorId: stella!.id,
      action: "model-version.edited",
      entityType: "model-version",
      entityId: String(v2!.id),
      before: null,
      after: null,
    });
    await migrator(sequelize).up();
    const rows = await models().ModelVersionContributor.findAll({
      where: { versionId: v2!.id },
      order: [
        ["userId", "ASC"],
        ["role", "ASC"],
      ],
    });
    expect(rows.map((r) => [r.userId, r.role])).toEqual(
      [
        [sam!.id, "author"],
        [sam!.id, "proposer"],
        [stella!.id, "editor"],
      ].sort((a, b) => Number(a[0]) - Number(b[0]) || String(a[1]).localeCompare(String(b[1]))),
    );
  });
});
