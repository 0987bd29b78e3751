import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** A fixed-window counter, e.g. `signin:account:erin@example.test`. */
export class RateLimit extends Model<InferAttributes<RateLimit>, InferCreationAttributes<RateLimit>> {
  declare key: string;
  declare count: number;
  declare windowStartedAt: Date;

  static initModel(sequelize: Sequelize): typeof RateLimit {
    RateLimit.init(
      {
        key: { type: DataTypes.STRING(300), primaryKey: true },
        count: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        windowStartedAt: { type: DataTypes.DATE, allowNull: false },
      },
      { sequelize, tableName: "rate_limits", underscored: true, timestamps: false },
    );
    return RateLimit;
  }
}
