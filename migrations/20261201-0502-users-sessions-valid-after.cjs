"use strict";

/** Sessions issued before this instant are refused: signing out ends the account's sessions. */
/** @param {{ context: import('sequelize').QueryInterface }} p */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.addColumn("users", "sessions_valid_after", { type: DataTypes.DATE, allowNull: true });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.removeColumn("users", "sessions_valid_after");
}

module.exports = { up, down };
