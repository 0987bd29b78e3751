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
  /** Normal boiling point (K, at 1 atm); null when unknown or none (added by migration RD01). */
  declare boilingPointK: CreationOptional<number | null>;
  /** Triple point (K); null when unknown (migration RD02). */
  declare triplePointK: CreationOptional<number | null>;
  /** Source of the two points; a recalled value says "(from memory)" (migration RD03). */
  declare phasePointsCitation: CreationOptional<string | null>;
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
        boilingPointK: { type: DataTypes.DOUBLE, allowNull: true, field: "boiling_point_k" },
        triplePointK: { type: DataTypes.DOUBLE, allowNull: true, field: "triple_point_k" },
        phasePointsCitation: { type: DataTypes.STRING(300), allowNull: true, field: "phase_points_citation" },
        critical: { type: DataTypes.JSON, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "species", underscored: true },
    );
    return Species;
  }
}
