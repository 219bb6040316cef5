import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { Membership } from './membership';

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare email: string;
  declare name: string;
  declare passwordHash: string;
  declare lengthUnit: CreationOptional<'in' | 'cm'>;
  declare fabricUnit: CreationOptional<'yd' | 'm'>;
  declare timeZone: CreationOptional<string>;
  declare sessionVersion: CreationOptional<number>;
  declare emailVerifiedAt: CreationOptional<Date | null>;
  declare currentStudioId: CreationOptional<string | null>;
  declare mailReminders: CreationOptional<boolean>;
  declare mailTrialNews: CreationOptional<boolean>;
  declare mailDigest: CreationOptional<boolean>;
  /** Set when the person deleted their account: the row stays, without anything that names them. */
  declare deletedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare memberships?: NonAttribute<Membership[]>;

  static initModel(sequelize: Sequelize) {
    User.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        email: { type: DataTypes.STRING(254), allowNull: false, validate: { isEmail: true } },
        name: { type: DataTypes.STRING(120), allowNull: false },
        passwordHash: { type: DataTypes.STRING(100), allowNull: false },
        lengthUnit: { type: DataTypes.STRING(2), allowNull: false, defaultValue: 'in' },
        fabricUnit: { type: DataTypes.STRING(2), allowNull: false, defaultValue: 'yd' },
        timeZone: { type: DataTypes.STRING(64), allowNull: false, defaultValue: 'UTC' },
        sessionVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        emailVerifiedAt: { type: DataTypes.DATE, allowNull: true },
        currentStudioId: { type: DataTypes.UUID, allowNull: true },
        mailReminders: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        mailTrialNews: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        mailDigest: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        deletedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      {
        sequelize,
        tableName: 'users',
        // The hash never leaves the model unless a query asks for it by scope.
        defaultScope: { attributes: { exclude: ['passwordHash'] } },
        scopes: { withPassword: { attributes: { include: ['passwordHash'] } } },
      },
    );
  }
}
