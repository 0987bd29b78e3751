import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from "sequelize";
import type { Species } from "./species";

/** One data family or variant of a species' Cp ("CH4, Shomate"); its versions hold the coefficients. */
export class CpModel extends Model<InferAttributes<CpModel>, InferCreationAttributes<CpModel>> {
  declare id: CreationOptional<number>;
  declare speciesId: number;
  /** null: a global reference model, read-only in the app. */
  declare teamId: number | null;
  declare name: string;
  declare family: string;
  /** Distinguishes sets of one family for one species ("anharmonic", "rrho", "liquid"); null when there is one. */
  declare variant: CreationOptional<string | null>;
  declare copiedFromId: number | null;
  declare createdById: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare species?: NonAttribute<Species>;

  static initModel(sequelize: Sequelize): typeof CpModel {
    CpModel.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        speciesId: { type: DataTypes.INTEGER, allowNull: false },
        teamId: { type: DataTypes.INTEGER, allowNull: true },
        name: { type: DataTypes.STRING(160), allowNull: false },
        family: { type: DataTypes.STRING(40), allowNull: false },
        variant: { type: DataTypes.STRING(40), allowNull: true, defaultValue: null },
        copiedFromId: { type: DataTypes.INTEGER, allowNull: true },
        createdById: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "cp_models", underscored: true },
    );
    return CpModel;
  }
}
