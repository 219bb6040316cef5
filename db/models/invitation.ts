import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { InvitableRole } from '../../server/domain/roles';
import type { Studio } from './studio';
import type { User } from './user';

export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<string>;
  declare studioId: ForeignKey<Studio['id']>;
  declare email: string;
  declare role: InvitableRole;
  declare tokenHash: string;
  declare invitedById: ForeignKey<User['id']> | null;
  declare expiresAt: Date;
  declare acceptedAt: CreationOptional<Date | null>;
  declare acceptedById: CreationOptional<string | null>;
  declare revokedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare studio?: NonAttribute<Studio>;

  static initModel(sequelize: Sequelize) {
    Invitation.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        email: { type: DataTypes.STRING(254), allowNull: false },
        role: { type: DataTypes.STRING(20), allowNull: false },
        tokenHash: { type: DataTypes.STRING(64), allowNull: false },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        acceptedAt: { type: DataTypes.DATE, allowNull: true },
        acceptedById: { type: DataTypes.UUID, allowNull: true },
        revokedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'invitations' },
    );
  }
}
