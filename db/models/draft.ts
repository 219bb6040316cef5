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
import type { Pattern } from './pattern';

/** A numbered version of a pattern's files with its change note. */
export class Draft extends Model<InferAttributes<Draft>, InferCreationAttributes<Draft>> {
  declare id: CreationOptional<string>;
  declare patternId: ForeignKey<Pattern['id']>;
  declare version: number;
  declare changeNote: string;
  declare createdById: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare files?: NonAttribute<DraftFile[]>;
  declare pattern?: NonAttribute<Pattern>;

  static initModel(sequelize: Sequelize) {
    Draft.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        version: { type: DataTypes.INTEGER, allowNull: false },
        changeNote: { type: DataTypes.TEXT, allowNull: false },
        createdById: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'drafts' },
    );
  }
}

export class DraftFile extends Model<InferAttributes<DraftFile>, InferCreationAttributes<DraftFile>> {
  declare id: CreationOptional<string>;
  declare draftId: ForeignKey<Draft['id']>;
  declare kind: string;
  declare originalName: string;
  declare objectKey: string;
  declare bytes: number;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare draft?: NonAttribute<Draft>;
  declare downloads?: NonAttribute<DraftDownload[]>;

  static initModel(sequelize: Sequelize) {
    DraftFile.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        kind: { type: DataTypes.STRING(24), allowNull: false },
        originalName: { type: DataTypes.STRING(200), allowNull: false },
        objectKey: { type: DataTypes.STRING(80), allowNull: false, unique: true },
        bytes: { type: DataTypes.INTEGER, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'draft_files' },
    );
  }
}

/** Who fetched which file, and when: the designer sees who has which version. */
export class DraftDownload extends Model<InferAttributes<DraftDownload>, InferCreationAttributes<DraftDownload>> {
  declare id: CreationOptional<string>;
  declare draftFileId: ForeignKey<DraftFile['id']>;
  declare userId: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare user?: NonAttribute<{ name: string }>;

  static initModel(sequelize: Sequelize) {
    DraftDownload.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        userId: { type: DataTypes.UUID, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'draft_downloads' },
    );
  }
}
