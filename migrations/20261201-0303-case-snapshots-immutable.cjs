"use strict";

/**
 * A result snapshot is written once and never changes or disappears. The service
 * has no update path; this is the database's own guard.
 * @param {{ context: import('sequelize').QueryInterface }} p
 */
async function up({ context: qi }) {
  const sequelize = qi.sequelize;
  if (sequelize.getDialect() === "postgres") {
    await sequelize.query(`
      CREATE OR REPLACE FUNCTION case_snapshots_guard() RETURNS trigger AS $$
      BEGIN
        IF TG_OP = 'DELETE' THEN
          RAISE EXCEPTION 'case snapshots cannot be deleted';
        END IF;
        RAISE EXCEPTION 'case snapshots are immutable';
      END $$ LANGUAGE plpgsql;`);
    await sequelize.query(`CREATE TRIGGER case_snapshots_immutable BEFORE UPDATE OR DELETE ON case_snapshots FOR EACH ROW EXECUTE FUNCTION case_snapshots_guard();`);
    return;
  }
  await sequelize.query(`
    CREATE TRIGGER case_snapshots_no_update BEFORE UPDATE ON case_snapshots
    BEGIN SELECT RAISE(ABORT, 'case snapshots are immutable'); END;`);
  await sequelize.query(`
    CREATE TRIGGER case_snapshots_no_delete BEFORE DELETE ON case_snapshots
    BEGIN SELECT RAISE(ABORT, 'case snapshots cannot be deleted'); END;`);
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  const sequelize = qi.sequelize;
  if (sequelize.getDialect() === "postgres") {
    await sequelize.query(`DROP TRIGGER IF EXISTS case_snapshots_immutable ON case_snapshots;`);
    await sequelize.query(`DROP FUNCTION IF EXISTS case_snapshots_guard();`);
    return;
  }
  await sequelize.query(`DROP TRIGGER IF EXISTS case_snapshots_no_update;`);
  await sequelize.query(`DROP TRIGGER IF EXISTS case_snapshots_no_delete;`);
}

module.exports = { up, down };
