import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export const MAIL_KINDS = ["invitation", "review-requested", "review-decided", "model-proposed", "model-decided", "comment-posted", "model-impact"] as const;
export type MailKind = (typeof MAIL_KINDS)[number];
export type MailStatus = "queued" | "sending" | "sent" | "failed";

/** A queued outgoing message. The worker claims it atomically, sends it, and retries on failure. */
export class MailMessage extends Model<InferAttributes<MailMessage>, InferCreationAttributes<MailMessage>> {
  declare id: CreationOptional<number>;
  declare teamId: number | null;
  declare kind: MailKind;
  declare recipients: string[];
  declare subject: string;
  declare body: string;
  declare status: CreationOptional<MailStatus>;
  declare attempts: CreationOptional<number>;
  declare nextAttemptAt: Date;
  declare claimToken: string | null;
  declare claimedAt: Date | null;
  declare sentAt: Date | null;
  declare lastError: string | null;
  /** The Message-ID the row is sent with; the catcher links what it receives back to this row by it. */
  declare messageId: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof MailMessage {
    MailMessage.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        teamId: { type: DataTypes.INTEGER, allowNull: true },
        kind: { type: DataTypes.STRING(40), allowNull: false },
        recipients: { type: DataTypes.JSON, allowNull: false },
        subject: { type: DataTypes.STRING(300), allowNull: false },
        body: { type: DataTypes.TEXT, allowNull: false },
        status: { type: DataTypes.STRING(12), allowNull: false, defaultValue: "queued" },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        nextAttemptAt: { type: DataTypes.DATE, allowNull: false },
        claimToken: { type: DataTypes.STRING(40), allowNull: true },
        claimedAt: { type: DataTypes.DATE, allowNull: true },
        sentAt: { type: DataTypes.DATE, allowNull: true },
        lastError: { type: DataTypes.STRING(500), allowNull: true },
        messageId: { type: DataTypes.STRING(200), allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "mail_messages", underscored: true },
    );
    return MailMessage;
  }
}
