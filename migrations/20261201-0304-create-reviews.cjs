"use strict";

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.createTable("reviews", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    case_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "cases", key: "id" }, onDelete: "RESTRICT" },
    snapshot_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "case_snapshots", key: "id" }, onDelete: "RESTRICT" },
    reviewer_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
    decision: { type: DataTypes.STRING(12), allowNull: false },
    reason: { type: DataTypes.TEXT, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("reviews", ["case_id"], { name: "reviews_case" });
  // One decision per snapshot: a second reviewer cannot overwrite the first.
  await qi.addIndex("reviews", ["snapshot_id"], { unique: true, name: "reviews_snapshot" });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.dropTable("reviews");
}

module.exports = { up, down };
