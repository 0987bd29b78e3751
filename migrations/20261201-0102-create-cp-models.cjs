"use strict";

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.createTable("cp_models", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    species_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "species", key: "id" }, onDelete: "CASCADE" },
    team_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "teams", key: "id" }, onDelete: "CASCADE" },
    // e.g. "NASA-7 (third-millennium, 2015)", "Shomate (NIST-JANAF fit)", "Measured, Larkspur lab".
    name: { type: DataTypes.STRING(160), allowNull: false },
    family: { type: DataTypes.STRING(40), allowNull: false },
    // Reference model this team model was copied from, if any.
    copied_from_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "cp_models", key: "id" }, onDelete: "SET NULL" },
    created_by_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "users", key: "id" }, onDelete: "SET NULL" },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("cp_models", ["species_id"], { name: "cp_models_species" });
  await qi.addIndex("cp_models", ["team_id"], { name: "cp_models_team" });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.dropTable("cp_models");
}

module.exports = { up, down };
