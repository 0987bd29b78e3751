"use strict";

/**
 * Each queued message carries the Message-ID it is sent with, so what the local
 * catcher receives is tied to the queue row (and through it to the team whose
 * action queued it), never matched by recipient address.
 */
/** @param {{ context: import('sequelize').QueryInterface }} p */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.addColumn("mail_messages", "message_id", { type: DataTypes.STRING(200), allowNull: true });
  await qi.addIndex("mail_messages", ["message_id"], { name: "mail_messages_message_id", unique: true });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.removeIndex("mail_messages", "mail_messages_message_id");
  await qi.removeColumn("mail_messages", "message_id");
}

module.exports = { up, down };
