import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { User } from './user';

/** A session ended by signing out: its token is refused until it would have expired. */
export class RevokedSession extends Model<InferAttributes<RevokedSession>, InferCreationAttributes<RevokedSession>> {
  declare sessionId: string;
  declare userId: ForeignKey<User['id']>;
  declare expiresAt: Date;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    RevokedSession.init(
      {
        sessionId: { type: DataTypes.UUID, primaryKey: true },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'revoked_sessions', updatedAt: false },
    );
  }
}

/** A sign-up waiting for the link in its confirmation e-mail; the account is made from it. */
export class SignUpRequest extends Model<InferAttributes<SignUpRequest>, InferCreationAttributes<SignUpRequest>> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare name: string;
  declare passwordHash: string;
  declare nextPath: string | null;
  declare timeZone: CreationOptional<string>;
  declare tokenHash: string;
  declare expiresAt: Date;
  declare usedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    SignUpRequest.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        email: { type: DataTypes.STRING(254), allowNull: false },
        name: { type: DataTypes.STRING(120), allowNull: false },
        passwordHash: { type: DataTypes.STRING(100), allowNull: false },
        nextPath: { type: DataTypes.STRING(300), allowNull: true },
        timeZone: { type: DataTypes.STRING(64), allowNull: false, defaultValue: 'UTC' },
        tokenHash: { type: DataTypes.STRING(64), allowNull: false },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        usedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'sign_up_requests', defaultScope: { attributes: { exclude: ['passwordHash'] } }, scopes: { withPassword: {} } },
    );
  }
}
