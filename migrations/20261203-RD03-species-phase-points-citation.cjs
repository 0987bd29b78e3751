"use strict";

/**
 * species.phase_points_citation: Where the boiling and triple points come from (a recalled value says so).
 * @param {{ context: import('sequelize').QueryInterface }} p
 */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.addColumn("species", "phase_points_citation", { type: DataTypes.STRING(300), allowNull: true });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.removeColumn("species", "phase_points_citation");
}

module.exports = { up, down };
