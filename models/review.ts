import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { Decision } from "@/lib/validation/cases";

/** A reviewer's decision on one snapshot of a case. */
export class Review extends Model<InferAttributes<Review>, InferCreationAttributes<Review>> {
  declare id: CreationOptional<number>;
  declare caseId: number;
  declare snapshotId: number;
  declare reviewerId: number;
  declare decision: Decision;
  declare reason: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof Review {
    Review.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        caseId: { type: DataTypes.INTEGER, allowNull: false },
        snapshotId: { type: DataTypes.INTEGER, allowNull: false },
        reviewerId: { type: DataTypes.INTEGER, allowNull: false },
        decision: { type: DataTypes.STRING(12), allowNull: false },
        reason: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: "reviews", underscored: true, updatedAt: false },
    );
    return Review;
  }
}
