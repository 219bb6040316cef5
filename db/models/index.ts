import type { Sequelize } from 'sequelize';
import { Invitation } from './invitation';
import { Membership } from './membership';
import { PasswordReset } from './password-reset';
import { Studio } from './studio';
import { TesterProfile } from './tester-profile';
import { User } from './user';

export { Invitation, Membership, PasswordReset, Studio, TesterProfile, User };

/** Registers every model, then wires the associations once all of them exist. */
export function initModels(sequelize: Sequelize): void {
  User.initModel(sequelize);
  Studio.initModel(sequelize);
  Membership.initModel(sequelize);
  TesterProfile.initModel(sequelize);
  PasswordReset.initModel(sequelize);
  Invitation.initModel(sequelize);

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
}
