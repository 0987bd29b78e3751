"use strict";

/**
 * species.boiling_point_k: Normal boiling point (K, at 1 atm), for the condensation screen; NULL when unknown or when the species has none (it sublimes, or is a radical).
 * @param {{ context: import('sequelize').QueryInterface }} p
 */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.addColumn("species", "boiling_point_k", { type: DataTypes.DOUBLE, allowNull: true });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.removeColumn("species", "boiling_point_k");
}

module.exports = { up, down };
