import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { ReportDraft } from '../../server/domain/schemas/reports';
import type { Enrollment } from './enrollment';

/** A tester's check-in (after the toile) or final report (after the garment). */
export class Report extends Model<InferAttributes<Report>, InferCreationAttributes<Report>> {
  declare id: CreationOptional<string>;
  declare enrollmentId: ForeignKey<Enrollment['id']>;
  declare stage: 'check-in' | 'final';
  declare content: CreationOptional<ReportDraft>;
  /** Raised by every save; a save from an older version is refused. */
  declare version: CreationOptional<number>;
  declare submittedAt: CreationOptional<Date | null>;
  /** The parts a final report took over from the check-in when it was started. */
  declare prefilled: CreationOptional<string[]>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Report.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        stage: { type: DataTypes.STRING(12), allowNull: false },
        content: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        submittedAt: { type: DataTypes.DATE, allowNull: true },
        prefilled: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'reports' },
    );
  }
}
