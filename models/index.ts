import type { Sequelize } from "sequelize";
import { AuditEvent } from "./audit-event";
import { Invitation } from "./invitation";
import { Membership } from "./membership";
import { Team } from "./team";
import { User } from "./user";

/** Initialise every model on one Sequelize instance and wire the associations. */
export function defineModels(sequelize: Sequelize) {
  User.initModel(sequelize);
  Team.initModel(sequelize);
  Membership.initModel(sequelize);
  Invitation.initModel(sequelize);
  AuditEvent.initModel(sequelize);

  Team.hasMany(Membership, { foreignKey: "teamId", as: "memberships" });
  Membership.belongsTo(Team, { foreignKey: "teamId", as: "team" });
  User.hasMany(Membership, { foreignKey: "userId", as: "memberships" });
  Membership.belongsTo(User, { foreignKey: "userId", as: "user" });
  Invitation.belongsTo(Team, { foreignKey: "teamId", as: "team" });
  Invitation.belongsTo(User, { foreignKey: "invitedById", as: "invitedBy" });

  return { User, Team, Membership, Invitation, AuditEvent };
}

export type Models = ReturnType<typeof defineModels>;
export type { AuditEvent, Invitation, Membership, Team, User };
