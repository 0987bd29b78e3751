"use strict";

/** Sign-in attempt counters per account and per client address, shared by every app server. */
/** @param {{ context: import('sequelize').QueryInterface }} p */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.createTable("rate_limits", {
    key: { type: DataTypes.STRING(300), primaryKey: true },
    count: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    window_started_at: { type: DataTypes.DATE, allowNull: false },
  });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.dropTable("rate_limits");
}

module.exports = { up, down };
