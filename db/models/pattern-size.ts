import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { Pattern } from './pattern';

/** One size of a pattern's chart: its place in the order and its body and finished lengths in mm. */
export class PatternSize extends Model<InferAttributes<PatternSize>, InferCreationAttributes<PatternSize>> {
  declare id: CreationOptional<string>;
  declare patternId: ForeignKey<Pattern['id']>;
  declare label: string;
  declare position: number;
  declare bodyMm: CreationOptional<Record<string, number>>;
  declare finishedMm: CreationOptional<Record<string, number>>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    PatternSize.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        label: { type: DataTypes.STRING(20), allowNull: false },
        position: { type: DataTypes.INTEGER, allowNull: false },
        bodyMm: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        finishedMm: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'pattern_sizes' },
    );
  }
}
