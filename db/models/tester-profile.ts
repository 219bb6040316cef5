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

/** A tester's own body profile; applications copy it as a snapshot. Lengths in millimetres. */
export class TesterProfile extends Model<InferAttributes<TesterProfile>, InferCreationAttributes<TesterProfile>> {
  declare userId: ForeignKey<User['id']>;
  declare measurementsMm: CreationOptional<Record<string, number>>;
  declare experience: CreationOptional<string | null>;
  declare fitNotes: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    TesterProfile.init(
      {
        userId: { type: DataTypes.UUID, primaryKey: true },
        measurementsMm: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        experience: { type: DataTypes.STRING(20), allowNull: true },
        fitNotes: { type: DataTypes.STRING(1000), allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'tester_profiles' },
    );
  }
}
