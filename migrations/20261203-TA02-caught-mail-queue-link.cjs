"use strict";

/**
 * A caught message points at the queue row that sent it (found by Message-ID on
 * arrival). The outbox lists caught mail through this link only, so a message is
 * shown to the team that queued it and to nobody else.
 */
/** @param {{ context: import('sequelize').QueryInterface }} p */
async function up({ context: qi }) {
  const { DataTypes } = require("sequelize");
  await qi.addColumn("caught_mail", "mail_message_id", {
    type: DataTypes.INTEGER,
    allowNull: true,
    references: { model: "mail_messages", key: "id" },
    onDelete: "SET NULL",
  });
  await qi.addIndex("caught_mail", ["mail_message_id"], { name: "caught_mail_queue_row" });
}

/** @param {{ context: import('sequelize').QueryInterface }} p */
async function down({ context: qi }) {
  await qi.removeIndex("caught_mail", "caught_mail_queue_row");
  await qi.removeColumn("caught_mail", "mail_message_id");
}

module.exports = { up, down };
