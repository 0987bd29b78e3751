"use strict";

/**
 * An approved or superseded version never changes; the only update allowed is
 * approved → superseded (with its bookkeeping columns). Deleting one is refused too.
 * The service refuses first; this is the database's own guard. Both dialects
 * refuse with the same words.
 * @param {{ context: import('sequelize').QueryInterface }} p
 */
async function up({ context: qi }) {
  const sequelize = qi.sequelize;
  if (sequelize.getDialect() === "postgres") {
    await sequelize.query(`
      CREATE OR REPLACE FUNCTION model_versions_guard() RETURNS trigger AS $$
      BEGIN
        IF TG_OP = 'DELETE' THEN
          IF OLD.status IN ('approved', 'superseded') THEN
            RAISE EXCEPTION 'approved model versions cannot be deleted (version %, %)', OLD.id, OLD.status;
          END IF;
          RETURN OLD;
        END IF;
        IF OLD.status IN ('approved', 'superseded') AND NOT (
          OLD.status = 'approved' AND NEW.status = 'superseded'
          AND NEW.data::text = OLD.data::text AND NEW.citation = OLD.citation
          AND NEW.model_id = OLD.model_id AND NEW.version_number = OLD.version_number
          AND NEW.uncertainty::text IS NOT DISTINCT FROM OLD.uncertainty::text
        ) THEN
          RAISE EXCEPTION 'approved model versions are immutable (version %, %)', OLD.id, OLD.status;
        END IF;
        RETURN NEW;
      END $$ LANGUAGE plpgsql;`);
    await sequelize.query(`CREATE TRIGGER model_versions_immutable BEFORE UPDATE OR DELETE ON model_versions FOR EACH ROW EXECUTE FUNCTION model_versions_guard();`);
    return;
  }
  await sequelize.query(`
    CREATE TRIGGER model_versions_immutable BEFORE UPDATE ON model_versions
    WHEN OLD.status IN ('approved', 'superseded') AND NOT (
      OLD.status = 'approved' AND NEW.status = 'superseded'
      AND NEW.data IS OLD.data AND NEW.citation IS OLD.citation
      AND NEW.model_id IS OLD.model_id AND NEW.version_number IS OLD.version_number
      AND NEW.uncertainty IS OLD.uncertainty
    )
    BEGIN SELECT RAISE(ABORT, 'approved model versions are immutable'); END;`);
  await sequelize.query(`
    CREATE TRIGGER model_versions_no_delete BEFORE DELETE ON model_versions
    WHEN OLD.status IN ('approved', 'superseded')
    BEGIN SELECT RAISE(ABORT, 'approved model versions cannot be deleted'); END;`);
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  const sequelize = qi.sequelize;
  if (sequelize.getDialect() === "postgres") {
    await sequelize.query(`DROP TRIGGER IF EXISTS model_versions_immutable ON model_versions;`);
    await sequelize.query(`DROP FUNCTION IF EXISTS model_versions_guard();`);
    return;
  }
  await sequelize.query(`DROP TRIGGER IF EXISTS model_versions_immutable;`);
  await sequelize.query(`DROP TRIGGER IF EXISTS model_versions_no_delete;`);
}

module.exports = { up, down };
