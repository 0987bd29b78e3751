import { createRequire } from "node:module";
import path from "node:path";
import type { Sequelize } from "sequelize";
import { SequelizeStorage, Umzug } from "umzug";

const load = createRequire(path.join(process.cwd(), "package.json"));

/** Umzug over migrations/*.cjs, recording what ran in the SequelizeMeta table. */
export function migrator(sequelize: Sequelize, root = process.cwd()) {
  return new Umzug({
    migrations: {
      glob: ["migrations/*.cjs", { cwd: root }],
      resolve: ({ name, path: file, context }) => {
        const migration = load(path.resolve(file!)) as {
          up: (p: { context: typeof context }) => Promise<void>;
          down: (p: { context: typeof context }) => Promise<void>;
        };
        return { name, up: () => migration.up({ context }), down: () => migration.down({ context }) };
      },
    },
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: "SequelizeMeta" }),
    logger: undefined,
  });
}

export async function migrateUp(sequelize: Sequelize) {
  return migrator(sequelize).up();
}

export async function migrateDownAll(sequelize: Sequelize) {
  return migrator(sequelize).down({ to: 0 });
}
