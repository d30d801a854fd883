import type { Sequelize } from 'sequelize';
import { defineActivityRead } from './activity-read';
import { defineApiToken } from './api-token';
import { defineEntry } from './entry';
import { defineMembership } from './membership';
import { defineInvitation } from './invitation';
import { defineNotification } from './notification';
import { defineOutgoingMail } from './outgoing-mail';
import { definePasswordReset } from './password-reset';
import { defineReceivedMail } from './received-mail';
import { defineRegion } from './region';
import { defineRegionCategory } from './region-category';
import { defineRegionComment } from './region-comment';
import { defineSample } from './sample';
import { defineSamplePlane } from './sample-plane';
import { defineSignInSession } from './sign-in-session';
import { defineSiteSetting } from './site-setting';
import { defineStudy } from './study';
import { defineTagger } from './tagger';
import { defineUser } from './user';

/**
 * Defines every model on one connection and declares how they relate. Each call makes fresh classes, so
 * two connections in one process (a test and the server it prepares) never rebind each other's models.
 */
export function defineModels(sequelize: Sequelize) {
  const User = defineUser(sequelize);
  const SiteSetting = defineSiteSetting(sequelize);
  const Study = defineStudy(sequelize);
  const Membership = defineMembership(sequelize);
  const Entry = defineEntry(sequelize);
  const Sample = defineSample(sequelize);
  const SamplePlane = defineSamplePlane(sequelize);
  const ApiToken = defineApiToken(sequelize);
  const SignInSession = defineSignInSession(sequelize);
  const Notification = defineNotification(sequelize);
  const OutgoingMail = defineOutgoingMail(sequelize);
  const ReceivedMail = defineReceivedMail(sequelize);
  const Invitation = defineInvitation(sequelize);
  const PasswordReset = definePasswordReset(sequelize);
  const RegionCategory = defineRegionCategory(sequelize);
  const Region = defineRegion(sequelize);
  const RegionComment = defineRegionComment(sequelize);
  const ActivityRead = defineActivityRead(sequelize);
  const Tagger = defineTagger(sequelize);

  Study.hasMany(Membership, { foreignKey: 'studyId', as: 'memberships' });
  Membership.belongsTo(Study, { foreignKey: 'studyId', as: 'study' });
  Membership.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  User.hasMany(Membership, { foreignKey: 'userId', as: 'memberships' });
  Study.hasMany(Entry, { foreignKey: 'studyId', as: 'entries' });
  Entry.belongsTo(Study, { foreignKey: 'studyId', as: 'study' });
  Entry.belongsTo(User, { foreignKey: 'createdById', as: 'createdBy' });
  Entry.belongsTo(User, { foreignKey: 'updatedById', as: 'updatedBy' });
  Study.hasMany(Sample, { foreignKey: 'studyId', as: 'samples' });
  Sample.belongsTo(Study, { foreignKey: 'studyId', as: 'study' });
  Sample.belongsTo(User, { foreignKey: 'uploadedById', as: 'uploadedBy' });
  Sample.hasMany(SamplePlane, { foreignKey: 'sampleId', as: 'planes' });
  ApiToken.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  Notification.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  Notification.belongsTo(User, { foreignKey: 'actorId', as: 'actor' });
  Notification.belongsTo(Study, { foreignKey: 'studyId', as: 'study' });
  Invitation.belongsTo(Study, { foreignKey: 'studyId', as: 'study' });
  Invitation.belongsTo(User, { foreignKey: 'invitedById', as: 'invitedBy' });
  Study.hasMany(Invitation, { foreignKey: 'studyId', as: 'invitations' });

  Region.belongsTo(RegionCategory, { foreignKey: 'categoryId', as: 'category' });
  Region.belongsTo(User, { foreignKey: 'createdById', as: 'createdBy' });
  Region.belongsTo(User, { foreignKey: 'stateChangedById', as: 'stateChangedBy' });
  Region.hasMany(RegionComment, { foreignKey: 'regionId', as: 'comments' });
  RegionComment.belongsTo(User, { foreignKey: 'authorId', as: 'author' });
  RegionComment.belongsTo(Region, { foreignKey: 'regionId', as: 'region' });

  Study.hasMany(Tagger, { foreignKey: 'studyId', as: 'taggers' });
  Tagger.belongsTo(User, { foreignKey: 'createdById', as: 'createdBy' });

  return { User, SiteSetting, Study, Membership, Entry, Sample, SamplePlane, ApiToken, SignInSession, Notification, Tagger, OutgoingMail, ReceivedMail, Invitation, PasswordReset, RegionCategory, Region, RegionComment, ActivityRead };
}

export type Models = ReturnType<typeof defineModels>;
