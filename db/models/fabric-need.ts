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
import type { PatternSize } from './pattern-size';

/** The fabric length one size needs at one fabric width, with or without a one-way layout. */
export class FabricNeed extends Model<InferAttributes<FabricNeed>, InferCreationAttributes<FabricNeed>> {
  declare id: CreationOptional<string>;
  declare patternId: ForeignKey<Pattern['id']>;
  declare sizeId: ForeignKey<PatternSize['id']>;
  declare widthMm: number;
  declare napped: boolean;
  declare lengthMm: number;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    FabricNeed.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        widthMm: { type: DataTypes.REAL, allowNull: false },
        napped: { type: DataTypes.BOOLEAN, allowNull: false },
        lengthMm: { type: DataTypes.REAL, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'fabric_needs' },
    );
  }
}
