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
import type { FabricNeed } from './fabric-need';
import type { PatternSize } from './pattern-size';
import type { PatternVariant } from './pattern-variant';
import type { Studio } from './studio';

export class Pattern extends Model<InferAttributes<Pattern>, InferCreationAttributes<Pattern>> {
  declare id: CreationOptional<string>;
  declare studioId: ForeignKey<Studio['id']>;
  declare name: string;
  declare category: string;
  /** The designer says the pattern is made for children (whatever the category): children's cautions apply. */
  declare childrensWear: CreationOptional<boolean>;
  declare fabricKind: string;
  declare minStretchPct: CreationOptional<number | null>;
  declare notes: CreationOptional<string | null>;
  declare draftedHeightMm: CreationOptional<number | null>;
  declare bodyColumns: CreationOptional<string[]>;
  declare finishedColumns: CreationOptional<string[]>;
  declare archivedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare sizes?: NonAttribute<PatternSize[]>;
  declare variants?: NonAttribute<PatternVariant[]>;
  declare fabricNeeds?: NonAttribute<FabricNeed[]>;

  static initModel(sequelize: Sequelize) {
    Pattern.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        name: { type: DataTypes.STRING(120), allowNull: false },
        category: { type: DataTypes.STRING(30), allowNull: false },
        childrensWear: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        fabricKind: { type: DataTypes.STRING(20), allowNull: false },
        minStretchPct: { type: DataTypes.SMALLINT, allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: true },
        draftedHeightMm: { type: DataTypes.REAL, allowNull: true },
        bodyColumns: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        finishedColumns: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        archivedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'patterns' },
    );
  }
}
