import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";
import type { EvaluateRequest, EvaluateResult } from "@/lib/thermo";
import type { CaseInput } from "@/lib/validation/cases";

/** A pinned model version as it was when the snapshot was frozen. */
export type PinnedVersion = {
  key: string;
  formula: string;
  phase: string | null;
  versionId: number;
  modelId: number;
  speciesName: string;
  modelName: string;
  family: string;
  versionNumber: number;
  status: string;
  citation: string;
  data: unknown;
  /** The version's standard uncertainties, where it has them (added with the equilibrium work). */
  uncertainty?: { dfHkJ?: number; sJ?: number; cpRelative?: number } | null;
  /** The species' normal boiling and triple points (K) with their source, where the library has them (added with the condensation screen). */
  phasePoints?: { boilingPointK: number | null; triplePointK: number | null; citation: string | null } | null;
  /** The species' critical constants, where the library has them (added with the real-gas work). */
  critical?: { tcK: number; pcBar: number; omega: number };
};

/**
 * The frozen result of one submission. Written once; never updated or deleted
 * (no service path does, and database triggers refuse).
 */
export class CaseSnapshot extends Model<InferAttributes<CaseSnapshot>, InferCreationAttributes<CaseSnapshot>> {
  declare id: CreationOptional<number>;
  declare caseId: number;
  declare teamId: number;
  declare revision: number;
  /** Title, notes and inputs as submitted. */
  declare inputs: CaseInput;
  declare pins: PinnedVersion[];
  declare engineVersion: string;
  declare request: EvaluateRequest;
  declare result: EvaluateResult;
  /** SHA-256 (hex) of the RFC 8785 canonical JSON of { inputs, pins, engineVersion, request, result }. */
  declare hash: string;
  declare createdById: number;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof CaseSnapshot {
    CaseSnapshot.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        caseId: { type: DataTypes.INTEGER, allowNull: false },
        teamId: { type: DataTypes.INTEGER, allowNull: false },
        revision: { type: DataTypes.INTEGER, allowNull: false },
        inputs: { type: DataTypes.JSON, allowNull: false },
        pins: { type: DataTypes.JSON, allowNull: false },
        engineVersion: { type: DataTypes.STRING(20), allowNull: false },
        request: { type: DataTypes.JSON, allowNull: false },
        result: { type: DataTypes.JSON, allowNull: false },
        hash: { type: DataTypes.STRING(64), allowNull: false },
        createdById: { type: DataTypes.INTEGER, allowNull: false },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: "case_snapshots", underscored: true, updatedAt: false },
    );
    return CaseSnapshot;
  }
}
