import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { Enrollment } from './enrollment';

/** A tester's photo of their toile or garment, stored cleaned (no EXIF) with a thumbnail. */
export class Photo extends Model<InferAttributes<Photo>, InferCreationAttributes<Photo>> {
  declare id: CreationOptional<string>;
  declare enrollmentId: ForeignKey<Enrollment['id']>;
  declare stage: 'check-in' | 'final';
  declare view: 'front' | 'side' | 'back' | 'detail';
  declare consent: 'staff-only' | 'may-share';
  declare fullKey: string;
  declare thumbKey: string;
  declare width: number;
  declare height: number;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Photo.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        stage: { type: DataTypes.STRING(12), allowNull: false },
        view: { type: DataTypes.STRING(12), allowNull: false },
        consent: { type: DataTypes.STRING(12), allowNull: false },
        fullKey: { type: DataTypes.STRING(80), allowNull: false },
        thumbKey: { type: DataTypes.STRING(80), allowNull: false },
        width: { type: DataTypes.INTEGER, allowNull: false },
        height: { type: DataTypes.INTEGER, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'photos' },
    );
  }
}
