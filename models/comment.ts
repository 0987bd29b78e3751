import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from "sequelize";

/** A remark on a case, optionally about one snapshot. */
export class Comment extends Model<InferAttributes<Comment>, InferCreationAttributes<Comment>> {
  declare id: CreationOptional<number>;
  declare caseId: number;
  declare snapshotId: number | null;
  declare authorId: number;
  declare body: string;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize): typeof Comment {
    Comment.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        caseId: { type: DataTypes.INTEGER, allowNull: false },
        snapshotId: { type: DataTypes.INTEGER, allowNull: true },
        authorId: { type: DataTypes.INTEGER, allowNull: false },
        body: { type: DataTypes.TEXT, allowNull: false },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: "comments", underscored: true, updatedAt: false },
    );
    return Comment;
  }
}
