"use strict";

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  // Snapshots are never updated or deleted, so no reference here cascades or sets null.
  await qi.createTable("case_snapshots", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    case_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "cases", key: "id" }, onDelete: "RESTRICT" },
    team_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "teams", key: "id" }, onDelete: "RESTRICT" },
    revision: { type: DataTypes.INTEGER, allowNull: false },
    inputs: { type: DataTypes.JSON, allowNull: false },
    // [{ versionId, key, formula, phase, speciesName, modelName, family, versionNumber, status, citation, data }]
    pins: { type: DataTypes.JSON, allowNull: false },
    engine_version: { type: DataTypes.STRING(20), allowNull: false },
    request: { type: DataTypes.JSON, allowNull: false },
    result: { type: DataTypes.JSON, allowNull: false },
    // SHA-256 of the RFC 8785 canonical JSON of { inputs, pins, engineVersion, request, result }.
    hash: { type: DataTypes.STRING(64), allowNull: false },
    created_by_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("case_snapshots", ["case_id", "revision"], { unique: true, name: "case_snapshots_case_revision" });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.dropTable("case_snapshots");
}

module.exports = { up, down };
