"use strict";

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.createTable("comments", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    case_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "cases", key: "id" }, onDelete: "CASCADE" },
    snapshot_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "case_snapshots", key: "id" }, onDelete: "RESTRICT" },
    author_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "users", key: "id" }, onDelete: "RESTRICT" },
    body: { type: DataTypes.TEXT, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("comments", ["case_id", "created_at"], { name: "comments_case_time" });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.dropTable("comments");
}

module.exports = { up, down };
