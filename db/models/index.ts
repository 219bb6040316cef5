import type { Sequelize } from 'sequelize';
import { Membership } from './membership';
import { Studio } from './studio';
import { User } from './user';

export { Membership, Studio, User };

/** Registers every model, then wires the associations once all of them exist. */
export function initModels(sequelize: Sequelize): void {
  User.initModel(sequelize);
  Studio.initModel(sequelize);
  Membership.initModel(sequelize);

  Studio.hasMany(Membership, { as: 'memberships', foreignKey: 'studioId' });
  Membership.belongsTo(Studio, { as: 'studio', foreignKey: 'studioId' });
  User.hasMany(Membership, { as: 'memberships', foreignKey: 'userId' });
  Membership.belongsTo(User, { as: 'user', foreignKey: 'userId' });
}
