import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export type SpeciesCritical = { tcK: number; pcBar: number; omega: number; citation: string };

export class Species extends Model<InferAttributes<Species>, InferCreationAttributes<Species>> {
  declare id: CreationOptional<number>;
  /** null: the global reference library. */
  declare teamId: number | null;
  declare formula: string;
  declare displayName: string;
  declare elements: Record<string, number>;
  declare molarMassGPerMol: number;
  declare identifiers: Record<string, string> | null;
  /** Critical constants for the real-gas equation of state, with their citation (migration GH01); null when unknown. */
  declare critical: CreationOptional<SpeciesCritical | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof Species {
    Species.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        teamId: { type: DataTypes.INTEGER, allowNull: true },
        formula: { type: DataTypes.STRING(60), allowNull: false },
        displayName: { type: DataTypes.STRING(120), allowNull: false },
        elements: { type: DataTypes.JSON, allowNull: false },
        molarMassGPerMol: { type: DataTypes.DOUBLE, allowNull: false, field: "molar_mass_g_per_mol" },
        identifiers: { type: DataTypes.JSON, allowNull: true },
        critical: { type: DataTypes.JSON, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "species", underscored: true },
    );
    return Species;
  }
}
