import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

export const IMPACT_STATUSES = ["queued", "running", "done", "failed"] as const;
export type ImpactStatus = (typeof IMPACT_STATUSES)[number];
export type ImpactTrigger = "manual" | "proposed" | "approved";

/** One case's change when its pin moves to the new version (lib/services/impact.ts). */
export type ImpactCase = {
  caseId: number;
  title: string;
  status: string;
  authorId: number;
  /** Version number(s) of the model the case pins now. */
  pinnedVersionNumbers: number[];
  maxDiffKJ: number | null;
  maxDiffLog10K: number | null;
  /** Largest change of the key species' outlet fraction (absolute), when the case has an equilibrium. */
  maxDiffKeyFraction: number | null;
  crossoversBefore: number[];
  crossoversAfter: number[];
  signCaseBefore: string | null;
  signCaseAfter: string | null;
  exceedsTolerance: boolean;
  /** Set when the case cannot be evaluated on one side (the engine's message). */
  error: string | null;
};

/** A background re-evaluation of a team's cases on a new model version. */
export class ImpactJob extends Model<InferAttributes<ImpactJob>, InferCreationAttributes<ImpactJob>> {
  declare id: CreationOptional<number>;
  declare teamId: number;
  declare versionId: number;
  declare trigger: ImpactTrigger;
  declare status: ImpactStatus;
  declare total: CreationOptional<number>;
  declare done: CreationOptional<number>;
  declare cases: ImpactCase[];
  declare error: string | null;
  declare notify: CreationOptional<boolean>;
  declare notifiedAt: Date | null;
  declare requestedById: number | null;
  declare startedAt: Date | null;
  declare finishedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof ImpactJob {
    ImpactJob.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        teamId: { type: DataTypes.INTEGER, allowNull: false },
        versionId: { type: DataTypes.INTEGER, allowNull: false },
        trigger: { type: DataTypes.STRING(12), allowNull: false },
        status: { type: DataTypes.STRING(12), allowNull: false },
        total: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        done: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        cases: { type: DataTypes.JSON, allowNull: false },
        error: { type: DataTypes.TEXT, allowNull: true },
        notify: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        notifiedAt: { type: DataTypes.DATE, allowNull: true },
        requestedById: { type: DataTypes.INTEGER, allowNull: true },
        startedAt: { type: DataTypes.DATE, allowNull: true },
        finishedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "impact_jobs", underscored: true },
    );
    return ImpactJob;
  }
}
