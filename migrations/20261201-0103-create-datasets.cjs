"use strict";

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.createTable("datasets", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    team_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "teams", key: "id" }, onDelete: "CASCADE" },
    species_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "species", key: "id" }, onDelete: "SET NULL" },
    name: { type: DataTypes.STRING(160), allowNull: false },
    original_filename: { type: DataTypes.STRING(255), allowNull: true },
    size_bytes: { type: DataTypes.INTEGER, allowNull: false },
    sha256: { type: DataTypes.STRING(64), allowNull: false },
    // Units as uploaded; points are stored in SI (tK, cpJ, sigmaJ).
    t_unit: { type: DataTypes.STRING(20), allowNull: false },
    cp_unit: { type: DataTypes.STRING(40), allowNull: false },
    points: { type: DataTypes.JSON, allowNull: false },
    uploaded_by_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "users", key: "id" }, onDelete: "SET NULL" },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("datasets", ["team_id"], { name: "datasets_team" });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.dropTable("datasets");
}

module.exports = { up, down };
