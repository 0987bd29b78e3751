import { DataTypes, Model, type CreationOptional, type ForeignKey, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from "sequelize";
import type { Role } from "@/lib/auth/permissions";
import type { Team } from "./team";
import type { User } from "./user";

export class Membership extends Model<InferAttributes<Membership>, InferCreationAttributes<Membership>> {
  declare id: CreationOptional<number>;
  declare teamId: ForeignKey<Team["id"]>;
  declare userId: ForeignKey<User["id"]>;
  declare role: Role;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare user?: NonAttribute<User>;
  declare team?: NonAttribute<Team>;

  static initModel(sequelize: Sequelize): typeof Membership {
    Membership.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        role: { type: DataTypes.STRING(20), allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: "memberships", underscored: true },
    );
    return Membership;
  }
}
