import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** How someone took part in a version: each of these rules them out of deciding on it. */
export const CONTRIBUTOR_ROLES = ["author", "editor", "proposer", "source", "uploader"] as const;
export type ContributorRole = (typeof CONTRIBUTOR_ROLES)[number];

/**
 * One person's part in one model version (author, editor, proposer, a
 * contributor of the unapproved version it was started from, or the uploader
 * of the dataset it was fitted to). Written by the
 * library service in the same transaction as the change; never updated.
 */
export class ModelVersionContributor extends Model<InferAttributes<ModelVersionContributor>, InferCreationAttributes<ModelVersionContributor>> {
  declare id: CreationOptional<number>;
  declare versionId: number;
  declare userId: number;
  declare role: ContributorRole;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof ModelVersionContributor {
    ModelVersionContributor.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        versionId: { type: DataTypes.INTEGER, allowNull: false },
        userId: { type: DataTypes.INTEGER, allowNull: false },
        role: { type: DataTypes.STRING(12), allowNull: false },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: "model_version_contributors", underscored: true, updatedAt: false },
    );
    return ModelVersionContributor;
  }
}
