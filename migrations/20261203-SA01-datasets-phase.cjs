"use strict";

/** The phase a dataset was measured in (cr, l, g, or a named solid); null when the uploader did not say. */
/** @param {{ context: import('sequelize').QueryInterface }} p */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.addColumn("datasets", "phase", { type: DataTypes.STRING(24), allowNull: true });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.removeColumn("datasets", "phase");
}

module.exports = { up, down };
