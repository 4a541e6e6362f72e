/**
 * All database models, bound to one Sequelize instance with their associations.
 * Columns and constraints come from the migrations; models add validation and typed access.
 */
import type { Sequelize } from 'sequelize';
import { ApiToken } from './api-token';
import { Asset } from './asset';
import { Build } from './build';
import { FindingRecord } from './finding-record';
import { Invitation } from './invitation';
import { MailMessage } from './mail-message';
import { Project } from './project';
import { ProjectMembership } from './project-membership';
import { ProjectPolicy } from './project-policy';
import { User } from './user';
import { Waiver } from './waiver';
import { WaiverEvent } from './waiver-event';

export {
  ApiToken,
  Asset,
  Build,
  FindingRecord,
  Invitation,
  MailMessage,
  Project,
  ProjectMembership,
  ProjectPolicy,
  User,
  Waiver,
  WaiverEvent
};

/** Every model class, for code that wants them as one object. */
export const models = {
  User,
  Project,
  ProjectMembership,
  ApiToken,
  ProjectPolicy,
  Build,
  Asset,
  FindingRecord,
  Waiver,
  WaiverEvent,
  MailMessage,
  Invitation
};
export type Models = typeof models;

/**
 * Binds every model to `sequelize` and declares the associations used by `include`.
 * Model classes are process-wide, so the last instance passed here is the one they use.
 */
export function initModels(sequelize: Sequelize): Models {
  for (const model of Object.values(models)) model.initModel(sequelize);

  Project.hasMany(ProjectMembership, { as: 'memberships', foreignKey: 'projectId' });
  ProjectMembership.belongsTo(Project, { as: 'project', foreignKey: 'projectId' });
  User.hasMany(ProjectMembership, { as: 'memberships', foreignKey: 'userId' });
  ProjectMembership.belongsTo(User, { as: 'user', foreignKey: 'userId' });

  Project.hasMany(ApiToken, { as: 'apiTokens', foreignKey: 'projectId' });
  ApiToken.belongsTo(Project, { as: 'project', foreignKey: 'projectId' });
  ApiToken.belongsTo(User, { as: 'createdBy', foreignKey: 'createdById' });

  Project.hasMany(ProjectPolicy, { as: 'policies', foreignKey: 'projectId' });
  ProjectPolicy.belongsTo(Project, { as: 'project', foreignKey: 'projectId' });
  ProjectPolicy.belongsTo(User, { as: 'createdBy', foreignKey: 'createdById' });

  Project.hasMany(Build, { as: 'builds', foreignKey: 'projectId' });
  Build.belongsTo(Project, { as: 'project', foreignKey: 'projectId' });
  Build.belongsTo(Build, { as: 'baseline', foreignKey: 'baselineBuildId' });
  Build.hasMany(Asset, { as: 'assets', foreignKey: 'buildId' });
  Asset.belongsTo(Build, { as: 'build', foreignKey: 'buildId' });
  Build.hasMany(FindingRecord, { as: 'findings', foreignKey: 'buildId' });
  FindingRecord.belongsTo(Build, { as: 'build', foreignKey: 'buildId' });
  Asset.hasMany(FindingRecord, { as: 'findings', foreignKey: 'assetId' });
  FindingRecord.belongsTo(Asset, { as: 'asset', foreignKey: 'assetId' });

  Project.hasMany(Waiver, { as: 'waivers', foreignKey: 'projectId' });
  Waiver.belongsTo(Project, { as: 'project', foreignKey: 'projectId' });
  Waiver.belongsTo(User, { as: 'proposedBy', foreignKey: 'proposedById' });
  Waiver.belongsTo(User, { as: 'decidedBy', foreignKey: 'decidedById' });
  Waiver.hasMany(WaiverEvent, { as: 'events', foreignKey: 'waiverId' });
  WaiverEvent.belongsTo(Waiver, { as: 'waiver', foreignKey: 'waiverId' });
  WaiverEvent.belongsTo(User, { as: 'user', foreignKey: 'userId' });
  FindingRecord.belongsTo(Waiver, { as: 'waiver', foreignKey: 'waiverId' });

  MailMessage.belongsTo(Build, { as: 'build', foreignKey: 'buildId' });
  Invitation.belongsTo(User, { as: 'invitedBy', foreignKey: 'invitedById' });

  return models;
}
