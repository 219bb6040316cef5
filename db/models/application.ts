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
import type { ApplicationStatus } from '../../server/domain/coverage';
import type { Trial } from './trial';
import type { User } from './user';

export class Application extends Model<InferAttributes<Application>, InferCreationAttributes<Application>> {
  declare id: CreationOptional<string>;
  declare trialId: ForeignKey<Trial['id']>;
  declare userId: ForeignKey<User['id']>;
  declare status: CreationOptional<ApplicationStatus>;
  declare sizeId: string | null;
  declare variantId: string | null;
  declare profileSnapshot: Record<string, unknown>;
  declare adviceSnapshot: Record<string, unknown> | null;
  declare plannedFabric: string;
  declare experience: string;
  declare photoConsent: 'staff-only' | 'may-share';
  declare note: CreationOptional<string | null>;
  declare decisionReason: CreationOptional<string | null>;
  declare appliedAt: Date;
  declare decidedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare user?: NonAttribute<User>;
  declare trial?: NonAttribute<Trial>;

  static initModel(sequelize: Sequelize) {
    Application.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        status: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'applied' },
        sizeId: { type: DataTypes.UUID, allowNull: true },
        variantId: { type: DataTypes.UUID, allowNull: true },
        profileSnapshot: { type: DataTypes.JSONB, allowNull: false },
        adviceSnapshot: { type: DataTypes.JSONB, allowNull: true },
        plannedFabric: { type: DataTypes.STRING(500), allowNull: false },
        experience: { type: DataTypes.STRING(20), allowNull: false },
        photoConsent: { type: DataTypes.STRING(12), allowNull: false },
        note: { type: DataTypes.STRING(2000), allowNull: true },
        decisionReason: { type: DataTypes.STRING(500), allowNull: true },
        appliedAt: { type: DataTypes.DATE, allowNull: false },
        decidedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'applications' },
    );
  }
}
