"use strict";

/**
 * Critical constants of a species for the real-gas equation of state:
 * { tcK, pcBar, omega, citation } (JSON), null when unknown. Reference species get them
 * from seeders/data/critical-constants.json (02-reference-library).
 * @param {{ context: import('sequelize').QueryInterface }} p
 */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.addColumn("species", "critical", { type: DataTypes.JSON, allowNull: true });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.removeColumn("species", "critical");
}

module.exports = { up, down };
