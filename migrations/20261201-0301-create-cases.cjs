"use strict";

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.createTable("cases", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    team_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "teams", key: "id" }, onDelete: "RESTRICT" },
    author_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
    title: { type: DataTypes.STRING(160), allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: true },
    status: { type: DataTypes.STRING(12), allowNull: false },
    // { terms: [{formula, phase, coefficient, versionId}], temperatures, referenceK, toleranceKJ, toleranceKFactor }
    inputs: { type: DataTypes.JSON, allowNull: false },
    lock_version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("cases", ["team_id", "status"], { name: "cases_team_status" });
  await qi.addIndex("cases", ["author_id"], { name: "cases_author" });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.dropTable("cases");
}

module.exports = { up, down };
