"use strict";

/**
 * A model's variant within its family ("anharmonic" and "rrho" CH4 sets of one
 * publication, or a Shomate liquid beside the gas), so seeders and imports can
 * find a model again without relying on its display name.
 * @param {{ context: import('sequelize').QueryInterface }} p
 */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.addColumn("cp_models", "variant", { type: DataTypes.STRING(40), allowNull: true });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.removeColumn("cp_models", "variant");
}

module.exports = { up, down };
