import type { Sequelize } from "sequelize";
import { AuditEvent } from "./audit-event";
import { Case } from "./case";
import { CaseSnapshot } from "./case-snapshot";
import { Comment } from "./comment";
import { ImpactJob } from "./impact-job";
import { Review } from "./review";
import { CaughtMail } from "./caught-mail";
import { MailMessage } from "./mail-message";
import { RateLimit } from "./rate-limit";
import { CpModel } from "./cp-model";
import { Dataset } from "./dataset";
import { ModelVersion } from "./model-version";
import { ModelVersionContributor } from "./model-version-contributor";
import { Species } from "./species";
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
  Species.initModel(sequelize);
  CpModel.initModel(sequelize);
  Dataset.initModel(sequelize);
  ModelVersion.initModel(sequelize);
  ModelVersionContributor.initModel(sequelize);
  MailMessage.initModel(sequelize);
  CaughtMail.initModel(sequelize);
  RateLimit.initModel(sequelize);
  Case.initModel(sequelize);
  CaseSnapshot.initModel(sequelize);
  Review.initModel(sequelize);
  Comment.initModel(sequelize);
  ImpactJob.initModel(sequelize);

  Team.hasMany(Membership, { foreignKey: "teamId", as: "memberships" });
  Membership.belongsTo(Team, { foreignKey: "teamId", as: "team" });
  User.hasMany(Membership, { foreignKey: "userId", as: "memberships" });
  Membership.belongsTo(User, { foreignKey: "userId", as: "user" });
  Invitation.belongsTo(Team, { foreignKey: "teamId", as: "team" });
  Invitation.belongsTo(User, { foreignKey: "invitedById", as: "invitedBy" });

  Species.hasMany(CpModel, { foreignKey: "speciesId", as: "models" });
  CpModel.belongsTo(Species, { foreignKey: "speciesId", as: "species" });
  CpModel.hasMany(ModelVersion, { foreignKey: "modelId", as: "versions" });
  ModelVersion.belongsTo(CpModel, { foreignKey: "modelId", as: "model" });
  ModelVersion.belongsTo(Dataset, { foreignKey: "datasetId", as: "dataset" });
  Dataset.belongsTo(Species, { foreignKey: "speciesId", as: "species" });

  Case.belongsTo(User, { foreignKey: "authorId", as: "author" });
  Case.hasMany(CaseSnapshot, { foreignKey: "caseId", as: "snapshots" });
  CaseSnapshot.belongsTo(Case, { foreignKey: "caseId", as: "case" });
  Case.hasMany(Review, { foreignKey: "caseId", as: "reviews" });
  Review.belongsTo(User, { foreignKey: "reviewerId", as: "reviewer" });
  Case.hasMany(Comment, { foreignKey: "caseId", as: "comments" });
  Comment.belongsTo(User, { foreignKey: "authorId", as: "author" });

  return {
    User,
    Team,
    Membership,
    Invitation,
    AuditEvent,
    Species,
    CpModel,
    Dataset,
    ModelVersion,
    ModelVersionContributor,
    MailMessage,
    CaughtMail,
    RateLimit,
    Case,
    CaseSnapshot,
    Review,
    Comment,
    ImpactJob,
  };
}

export type Models = ReturnType<typeof defineModels>;
export type {
  AuditEvent,
  Case,
  CaseSnapshot,
  Comment,
  Review,
  CaughtMail,
  MailMessage,
  CpModel,
  Dataset,
  Invitation,
  Membership,
  ModelVersion,
  ModelVersionContributor,
  Species,
  Team,
  User,
};
