"use strict";

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.createTable("model_versions", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    model_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "cp_models", key: "id" }, onDelete: "CASCADE" },
    team_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "teams", key: "id" }, onDelete: "CASCADE" },
    version_number: { type: DataTypes.INTEGER, allowNull: false },
    status: { type: DataTypes.STRING(12), allowNull: false },
    // The engine's species entry: { segments, transitions?, reference?, standardPressurePa? }.
    data: { type: DataTypes.JSON, allowNull: false },
    citation: { type: DataTypes.TEXT, allowNull: false },
    // { dfHkJ?, sJ?, cpRelative? } where the source states it.
    uncertainty: { type: DataTypes.JSON, allowNull: true },
    change_note: { type: DataTypes.TEXT, allowNull: true },
    decision_reason: { type: DataTypes.TEXT, allowNull: true },
    dataset_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "datasets", key: "id" }, onDelete: "SET NULL" },
    author_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "users", key: "id" }, onDelete: "SET NULL" },
    decided_by_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "users", key: "id" }, onDelete: "SET NULL" },
    proposed_at: { type: DataTypes.DATE, allowNull: true },
    decided_at: { type: DataTypes.DATE, allowNull: true },
    lock_version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("model_versions", ["model_id", "version_number"], { unique: true, name: "model_versions_model_number" });
  await qi.addIndex("model_versions", ["team_id", "status"], { name: "model_versions_team_status" });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.dropTable("model_versions");
}

module.exports = { up, down };
