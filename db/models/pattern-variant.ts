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

/** A variant (e.g. fuller-belly front, a cup size) that overrides some body columns per size. */
export class PatternVariant extends Model<InferAttributes<PatternVariant>, InferCreationAttributes<PatternVariant>> {
  declare id: CreationOptional<string>;
  declare patternId: ForeignKey<Pattern['id']>;
  declare name: string;
  declare kind: string;
  declare position: number;
  declare columns: CreationOptional<string[]>;
  declare valuesMm: CreationOptional<Record<string, Record<string, number>>>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    PatternVariant.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        name: { type: DataTypes.STRING(80), allowNull: false },
        kind: { type: DataTypes.STRING(20), allowNull: false },
        position: { type: DataTypes.INTEGER, allowNull: false },
        columns: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        valuesMm: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'pattern_variants' },
    );
  }
}
