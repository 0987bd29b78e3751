import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from "sequelize";
import type { SpeciesInput } from "@/lib/thermo/schema";
import type { CpModel } from "./cp-model";

export const VERSION_STATUSES = ["draft", "proposed", "approved", "rejected", "superseded"] as const;
export type VersionStatus = (typeof VERSION_STATUSES)[number];

export type VersionUncertainty = { dfHkJ?: number; sJ?: number; cpRelative?: number };

/**
 * One version of a Cp model. Approved and superseded versions are immutable
 * (the service refuses, and a database trigger refuses too).
 */
export class ModelVersion extends Model<InferAttributes<ModelVersion>, InferCreationAttributes<ModelVersion>> {
  declare id: CreationOptional<number>;
  declare modelId: number;
  declare teamId: number | null;
  declare versionNumber: number;
  declare status: VersionStatus;
  /** The engine's species entry, validated by its speciesSchema. */
  declare data: SpeciesInput;
  declare citation: string;
  declare uncertainty: VersionUncertainty | null;
  declare changeNote: string | null;
  declare decisionReason: string | null;
  declare datasetId: number | null;
  declare authorId: number | null;
  declare decidedById: number | null;
  declare proposedAt: Date | null;
  declare decidedAt: Date | null;
  /** Optimistic concurrency: a stale edit is answered 409. */
  declare lockVersion: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare model?: NonAttribute<CpModel>;

  static initModel(sequelize: Sequelize): typeof ModelVersion {
    ModelVersion.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        modelId: { type: DataTypes.INTEGER, allowNull: false },
        teamId: { type: DataTypes.INTEGER, allowNull: true },
        versionNumber: { type: DataTypes.INTEGER, allowNull: false },
        status: { type: DataTypes.STRING(12), allowNull: false },
        data: { type: DataTypes.JSON, allowNull: false },
        citation: { type: DataTypes.TEXT, allowNull: false },
        uncertainty: { type: DataTypes.JSON, allowNull: true },
        changeNote: { type: DataTypes.TEXT, allowNull: true },
        decisionReason: { type: DataTypes.TEXT, allowNull: true },
        datasetId: { type: DataTypes.INTEGER, allowNull: true },
        authorId: { type: DataTypes.INTEGER, allowNull: true },
        decidedById: { type: DataTypes.INTEGER, allowNull: true },
        proposedAt: { type: DataTypes.DATE, allowNull: true },
        decidedAt: { type: DataTypes.DATE, allowNull: true },
        lockVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "model_versions", underscored: true },
    );
    return ModelVersion;
  }
}
