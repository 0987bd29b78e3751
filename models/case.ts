import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from "sequelize";
import type { CaseInputs, CaseStatus } from "@/lib/validation/cases";
import type { User } from "./user";

/** A reaction or phase change over a temperature span, pinning one model version per species. */
export class Case extends Model<InferAttributes<Case>, InferCreationAttributes<Case>> {
  declare id: CreationOptional<number>;
  declare teamId: number;
  declare authorId: number;
  declare title: string;
  declare notes: string | null;
  declare status: CaseStatus;
  declare inputs: CaseInputs;
  /** Optimistic concurrency: a stale edit is answered 409. */
  declare lockVersion: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare author?: NonAttribute<User>;

  static initModel(sequelize: Sequelize): typeof Case {
    Case.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        teamId: { type: DataTypes.INTEGER, allowNull: false },
        authorId: { type: DataTypes.INTEGER, allowNull: false },
        title: { type: DataTypes.STRING(160), allowNull: false },
        notes: { type: DataTypes.TEXT, allowNull: true },
        status: { type: DataTypes.STRING(12), allowNull: false },
        inputs: { type: DataTypes.JSON, allowNull: false },
        lockVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "cases", underscored: true },
    );
    return Case;
  }
}
