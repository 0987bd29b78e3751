"use strict";

/**
 * species.triple_point_k: Triple point (K); below it the condensed phase is a solid. NULL when unknown.
 * @param {{ context: import('sequelize').QueryInterface }} p
 */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.addColumn("species", "triple_point_k", { type: DataTypes.DOUBLE, allowNull: true });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.removeColumn("species", "triple_point_k");
}

module.exports = { up, down };
