"use strict";

/** What the local SMTP catcher received (demo mode and tests only); the outbox page reads it. */
/** @param {{ context: import('sequelize').QueryInterface }} p */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.createTable("caught_mail", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    envelope_from: { type: DataTypes.STRING(320), allowNull: true },
    envelope_to: { type: DataTypes.JSON, allowNull: false },
    subject: { type: DataTypes.STRING(300), allowNull: false },
    text: { type: DataTypes.TEXT, allowNull: false },
    message_id: { type: DataTypes.STRING(300), allowNull: true },
    received_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("caught_mail", ["received_at"], { name: "caught_mail_received" });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.dropTable("caught_mail");
}

module.exports = { up, down };
