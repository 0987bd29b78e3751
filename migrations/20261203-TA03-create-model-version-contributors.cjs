"use strict";

/**
 * Everyone who put content into a model version or proposed it: its author
 * (who created, copied, fitted or imported it), every editor, the proposer, and
 * the contributors of an unapproved version it was started from. Nobody listed
 * here may approve or reject the version (the four-eyes rule, docs/library.md).
 * Existing rows are filled from the versions' authors and the audit trail.
 * @param {{ context: import('sequelize').QueryInterface }} p
 */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.createTable("model_version_contributors", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    version_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "model_versions", key: "id" }, onDelete: "CASCADE" },
    user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "users", key: "id" }, onDelete: "CASCADE" },
    role: { type: DataTypes.STRING(12), allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("model_version_contributors", ["version_id", "user_id", "role"], { name: "model_version_contributors_unique", unique: true });
  const sequelize = qi.sequelize;
  await sequelize.query(
    `INSERT INTO model_version_contributors (version_id, user_id, role, created_at)
     SELECT id, author_id, 'author', created_at FROM model_versions WHERE author_id IS NOT NULL`,
  );
  await sequelize.query(
    `INSERT INTO model_version_contributors (version_id, user_id, role, created_at)
     SELECT v.id, a.actor_id, CASE a.action WHEN 'model-version.edited' THEN 'editor' ELSE 'proposer' END, MIN(a.created_at)
     FROM audit_events a JOIN model_versions v ON CAST(v.id AS VARCHAR(40)) = a.entity_id
     WHERE a.entity_type = 'model-version' AND a.action IN ('model-version.edited', 'model-version.proposed') AND a.actor_id IS NOT NULL
     GROUP BY v.id, a.actor_id, a.action`,
  );
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.dropTable("model_version_contributors");
}

module.exports = { up, down };
