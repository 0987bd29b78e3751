"use strict";

/**
 * Background jobs that re-evaluate a team's cases pinned to older versions of a model on a
 * new version (the version page's impact panel). One row per run; progress in done/total,
 * per-case results in `cases` (JSON).
 * @param {{ context: import('sequelize').QueryInterface }} p
 */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.createTable("impact_jobs", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    team_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "teams", key: "id" }, onDelete: "CASCADE" },
    version_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "model_versions", key: "id" }, onDelete: "CASCADE" },
    // manual | proposed | approved
    trigger: { type: DataTypes.STRING(12), allowNull: false },
    // queued | running | done | failed
    status: { type: DataTypes.STRING(12), allowNull: false },
    total: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    done: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    cases: { type: DataTypes.JSON, allowNull: false },
    error: { type: DataTypes.TEXT, allowNull: true },
    // Mail the authors of affected cases when done (set for the run after approval).
    notify: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    notified_at: { type: DataTypes.DATE, allowNull: true },
    requested_by_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "users", key: "id" }, onDelete: "SET NULL" },
    started_at: { type: DataTypes.DATE, allowNull: true },
    finished_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("impact_jobs", ["version_id", "team_id"], { name: "impact_jobs_version_team" });
  await qi.addIndex("impact_jobs", ["status"], { name: "impact_jobs_status" });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.dropTable("impact_jobs");
}

module.exports = { up, down };
