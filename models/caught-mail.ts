import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** A message the local SMTP catcher received (demo mode and tests only). */
export class CaughtMail extends Model<InferAttributes<CaughtMail>, InferCreationAttributes<CaughtMail>> {
  declare id: CreationOptional<number>;
  declare envelopeFrom: string | null;
  declare envelopeTo: string[];
  declare subject: string;
  declare text: string;
  declare messageId: string | null;
  declare receivedAt: Date;
  /** The queue row that sent it (by Message-ID); null for mail Heatpath did not queue. */
  declare mailMessageId: CreationOptional<number | null>;

  static initModel(sequelize: Sequelize): typeof CaughtMail {
    CaughtMail.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        envelopeFrom: { type: DataTypes.STRING(320), allowNull: true },
        envelopeTo: { type: DataTypes.JSON, allowNull: false },
        subject: { type: DataTypes.STRING(300), allowNull: false },
        text: { type: DataTypes.TEXT, allowNull: false },
        messageId: { type: DataTypes.STRING(300), allowNull: true },
        receivedAt: { type: DataTypes.DATE, allowNull: false },
        mailMessageId: { type: DataTypes.INTEGER, allowNull: true },
      },
      { sequelize, tableName: "caught_mail", underscored: true, timestamps: false },
    );
    return CaughtMail;
  }
}
