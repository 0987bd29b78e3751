import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export type DatasetPoint = { tK: number; cpJ: number; sigmaJ?: number };

/** Measured T–Cp points as uploaded (units kept for the record), stored in SI. */
export class Dataset extends Model<InferAttributes<Dataset>, InferCreationAttributes<Dataset>> {
  declare id: CreationOptional<number>;
  declare teamId: number;
  declare speciesId: number | null;
  declare name: string;
  declare originalFilename: string | null;
  declare sizeBytes: number;
  declare sha256: string;
  declare tUnit: string;
  declare cpUnit: string;
  /** The phase measured (cr, l, g, cr-…); null when the uploader did not say. */
  declare phase: CreationOptional<string | null>;
  declare points: DatasetPoint[];
  declare uploadedById: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof Dataset {
    Dataset.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        teamId: { type: DataTypes.INTEGER, allowNull: false },
        speciesId: { type: DataTypes.INTEGER, allowNull: true },
        name: { type: DataTypes.STRING(160), allowNull: false },
        originalFilename: { type: DataTypes.STRING(255), allowNull: true },
        sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
        sha256: { type: DataTypes.STRING(64), allowNull: false },
        tUnit: { type: DataTypes.STRING(20), allowNull: false },
        cpUnit: { type: DataTypes.STRING(40), allowNull: false },
        phase: { type: DataTypes.STRING(24), allowNull: true },
        points: { type: DataTypes.JSON, allowNull: false },
        uploadedById: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "datasets", underscored: true },
    );
    return Dataset;
  }
}
