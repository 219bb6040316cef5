import type { Sequelize } from 'sequelize';
import { Application } from './application';
import { Enrollment } from './enrollment';
import { FabricNeed } from './fabric-need';
import { Invitation } from './invitation';
import { Membership } from './membership';
import { Milestone } from './milestone';
import { PasswordReset } from './password-reset';
import { Pattern } from './pattern';
import { PatternSize } from './pattern-size';
import { PatternVariant } from './pattern-variant';
import { Studio } from './studio';
import { TesterProfile } from './tester-profile';
import { Trial } from './trial';
import { User } from './user';

export { Application, Enrollment, FabricNeed, Invitation, Membership, Milestone, PasswordReset, Pattern, PatternSize, PatternVariant, Studio, TesterProfile, Trial, User };

/** Registers every model, then wires the associations once all of them exist. */
export function initModels(sequelize: Sequelize): void {
  User.initModel(sequelize);
  Studio.initModel(sequelize);
  Membership.initModel(sequelize);
  TesterProfile.initModel(sequelize);
  PasswordReset.initModel(sequelize);
  Invitation.initModel(sequelize);
  Pattern.initModel(sequelize);
  PatternSize.initModel(sequelize);
  PatternVariant.initModel(sequelize);
  FabricNeed.initModel(sequelize);
  Trial.initModel(sequelize);
  Milestone.initModel(sequelize);
  Application.initModel(sequelize);
  Enrollment.initModel(sequelize);

  Studio.hasMany(Membership, { as: 'memberships', foreignKey: 'studioId' });
  Membership.belongsTo(Studio, { as: 'studio', foreignKey: 'studioId' });
  User.hasMany(Membership, { as: 'memberships', foreignKey: 'userId' });
  Membership.belongsTo(User, { as: 'user', foreignKey: 'userId' });
  User.hasOne(TesterProfile, { as: 'testerProfile', foreignKey: 'userId' });
  TesterProfile.belongsTo(User, { as: 'user', foreignKey: 'userId' });
  User.hasMany(PasswordReset, { foreignKey: 'userId' });
  PasswordReset.belongsTo(User, { as: 'user', foreignKey: 'userId' });
  Studio.hasMany(Invitation, { as: 'invitations', foreignKey: 'studioId' });
  Invitation.belongsTo(Studio, { as: 'studio', foreignKey: 'studioId' });
  Invitation.belongsTo(User, { as: 'invitedBy', foreignKey: 'invitedById' });
  Studio.hasMany(Pattern, { as: 'patterns', foreignKey: 'studioId' });
  Pattern.belongsTo(Studio, { as: 'studio', foreignKey: 'studioId' });
  Pattern.hasMany(PatternSize, { as: 'sizes', foreignKey: 'patternId' });
  PatternSize.belongsTo(Pattern, { as: 'pattern', foreignKey: 'patternId' });
  Pattern.hasMany(PatternVariant, { as: 'variants', foreignKey: 'patternId' });
  Pattern.hasMany(FabricNeed, { as: 'fabricNeeds', foreignKey: 'patternId' });
  FabricNeed.belongsTo(PatternSize, { as: 'size', foreignKey: 'sizeId' });
  Studio.hasMany(Trial, { as: 'trials', foreignKey: 'studioId' });
  Trial.belongsTo(Studio, { as: 'studio', foreignKey: 'studioId' });
  Trial.belongsTo(Pattern, { as: 'pattern', foreignKey: 'patternId' });
  Trial.hasMany(Milestone, { as: 'milestones', foreignKey: 'trialId' });
  Trial.hasMany(Application, { as: 'applications', foreignKey: 'trialId' });
  Application.belongsTo(Trial, { as: 'trial', foreignKey: 'trialId' });
  Application.belongsTo(User, { as: 'user', foreignKey: 'userId' });
  Trial.hasMany(Enrollment, { as: 'enrollments', foreignKey: 'trialId' });
  Enrollment.belongsTo(Trial, { as: 'trial', foreignKey: 'trialId' });
  Enrollment.belongsTo(Application, { as: 'application', foreignKey: 'applicationId' });
  Enrollment.belongsTo(User, { as: 'user', foreignKey: 'userId' });
}
