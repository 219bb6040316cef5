import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { MilestoneKind } from '../../server/domain/trials';
import type { Trial } from './trial';

export class Milestone extends Model<InferAttributes<Milestone>, InferCreationAttributes<Milestone>> {
  declare id: CreationOptional<string>;
  declare trialId: ForeignKey<Trial['id']>;
  declare kind: MilestoneKind;
  declare dueAt: Date;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Milestone.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        kind: { type: DataTypes.STRING(24), allowNull: false },
        dueAt: { type: DataTypes.DATE, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'milestones' },
    );
  }
}
