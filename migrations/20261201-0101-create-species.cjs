"use strict";

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.createTable("species", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    // NULL: the global reference library, read-only in the app.
    team_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "teams", key: "id" }, onDelete: "CASCADE" },
    formula: { type: DataTypes.STRING(60), allowNull: false },
    display_name: { type: DataTypes.STRING(120), allowNull: false },
    elements: { type: DataTypes.JSON, allowNull: false },
    molar_mass_g_per_mol: { type: DataTypes.DOUBLE, allowNull: false },
    identifiers: { type: DataTypes.JSON, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("species", ["team_id", "formula"], { name: "species_team_formula" });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.dropTable("species");
}

module.exports = { up, down };
