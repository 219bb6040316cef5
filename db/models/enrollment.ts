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
import type { Application } from './application';
import type { Trial } from './trial';
import type { User } from './user';

export class Enrollment extends Model<InferAttributes<Enrollment>, InferCreationAttributes<Enrollment>> {
  declare id: CreationOptional<string>;
  declare trialId: ForeignKey<Trial['id']>;
  declare applicationId: ForeignKey<Application['id']>;
  declare userId: ForeignKey<User['id']>;
  declare sizeId: string;
  declare variantId: string | null;
  declare status: CreationOptional<'active' | 'dropped' | 'finished'>;
  declare dueOverrides: CreationOptional<Record<string, string>>;
  /** The studio let this tester off finishing (they count as done for the release). */
  declare excusedAt: CreationOptional<Date | null>;
  declare excuseNote: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare trial?: NonAttribute<Trial>;

  static initModel(sequelize: Sequelize) {
    Enrollment.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        sizeId: { type: DataTypes.UUID, allowNull: false },
        variantId: { type: DataTypes.UUID, allowNull: true },
        status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'active' },
        dueOverrides: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        excusedAt: { type: DataTypes.DATE, allowNull: true },
        excuseNote: { type: DataTypes.STRING(500), allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'enrollments' },
    );
  }
}
