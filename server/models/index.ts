/**
 * Every Sequelize model, initialised on one connection, with its associations.
 * Only repositories (server/<resource>/*.repository.ts) and the seed touch models.
 */
import type { Sequelize } from 'sequelize';
import { Studio, initStudio } from './studio';
import { Team, initTeam } from './team';
import { User, initUser } from './user';
import { Membership, initMembership } from './membership';
import { Invitation, initInvitation } from './invitation';
import { PasswordReset, initPasswordReset } from './password-reset';
import { ServiceToken, initServiceToken } from './service-token';
import { TargetProfile, initTargetProfile } from './target-profile';
import { Pack, initPack } from './pack';
import { Curve, initCurve } from './curve';
import { PackVersion, initPackVersion } from './pack-version';
import { VersionArtifact, initVersionArtifact } from './version-artifact';
import { VersionReview, initVersionReview } from './version-review';
import { Channel, ChannelMove, initChannels } from './channel';
import { Webhook, initWebhook } from './webhook';
import { WebhookDelivery, initWebhookDelivery } from './webhook-delivery';
import { VersionBake, initVersionBake } from './version-bake';
import { Activity, initActivity } from './activity';
import { VersionComment, initVersionComment } from './version-comment';
import { Notification, initNotification } from './notification';

export { Studio, Team };
export { User, Membership, Invitation, PasswordReset, ServiceToken };
export { TargetProfile };
export { Pack, Curve, PackVersion, VersionArtifact, VersionReview, Channel, ChannelMove };
export { Webhook, WebhookDelivery };
export { VersionBake };
export { Activity, VersionComment, Notification };

export function initModels(sequelize: Sequelize): void {
  initStudio(sequelize);
  initTeam(sequelize);
  Studio.hasMany(Team, { foreignKey: 'studioId', as: 'teams' });
  Team.belongsTo(Studio, { foreignKey: 'studioId', as: 'studio' });
  // accounts (issue 3)
  initUser(sequelize);
  initMembership(sequelize);
  initInvitation(sequelize);
  initPasswordReset(sequelize);
  initServiceToken(sequelize);
  User.belongsTo(Studio, { foreignKey: 'studioId', as: 'studio' });
  Membership.belongsTo(Team, { foreignKey: 'teamId', as: 'team' });
  Membership.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  User.hasMany(Membership, { foreignKey: 'userId', as: 'memberships' });
  Team.hasMany(Membership, { foreignKey: 'teamId', as: 'memberships' });
  Invitation.belongsTo(Team, { foreignKey: 'teamId', as: 'team' });
  PasswordReset.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  ServiceToken.belongsTo(Team, { foreignKey: 'teamId', as: 'team' });
  // target profiles (issue 5)
  initTargetProfile(sequelize);
  TargetProfile.belongsTo(Team, { foreignKey: 'teamId', as: 'team' });
  // packs and curves (issue 7)
  initPack(sequelize);
  initCurve(sequelize);
  Pack.belongsTo(Team, { foreignKey: 'teamId', as: 'team' });
  Curve.belongsTo(Pack, { foreignKey: 'packId', as: 'pack' });
  Pack.hasMany(Curve, { foreignKey: 'packId', as: 'curves' });
  initPackVersion(sequelize);
  initVersionArtifact(sequelize);
  PackVersion.belongsTo(Pack, { foreignKey: 'packId', as: 'pack' });
  PackVersion.hasMany(VersionArtifact, { foreignKey: 'versionId', as: 'artifacts' });
  VersionArtifact.belongsTo(PackVersion, { foreignKey: 'versionId', as: 'version' });
  initVersionReview(sequelize);
  PackVersion.hasMany(VersionReview, { foreignKey: 'versionId', as: 'reviews' });
  VersionReview.belongsTo(PackVersion, { foreignKey: 'versionId', as: 'version' });
  initChannels(sequelize);
  Channel.belongsTo(Pack, { foreignKey: 'packId', as: 'pack' });
  initWebhook(sequelize); // webhooks (issue 8 part 4)
  initWebhookDelivery(sequelize);
  WebhookDelivery.belongsTo(Webhook, { foreignKey: 'webhookId', as: 'webhook' });
  initVersionBake(sequelize); // background bakes (issue 7 part 2)
  initActivity(sequelize); // activity, comments and notices (issue 7 parts 3 and 5)
  initVersionComment(sequelize);
  initNotification(sequelize);
}
