import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { AnalysisOutput, ChangeRow } from '../../server/analysis/types';
import type { Trial } from './trial';
import type { User } from './user';

export type TriageState = 'open' | 'will-fix' | 'personal-fit' | 'fixed';

/** The findings of one draft of a trial as last computed, with a hash of their source data. */
export class FindingSnapshot extends Model<InferAttributes<FindingSnapshot>, InferCreationAttributes<FindingSnapshot>> {
  declare id: CreationOptional<string>;
  declare trialId: ForeignKey<Trial['id']>;
  declare draft: string;
  declare sourceHash: string;
  declare testers: number;
  declare result: AnalysisOutput;
  /** The change table of every finding, keyed "kind|direction" (rows for the ones the studio will fix are read). */
  declare changes: CreationOptional<Record<string, ChangeRow[]>>;
  /** Reports counted over every draft of the trial when this was computed. */
  declare reports: CreationOptional<number>;
  declare computedAt: Date;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    FindingSnapshot.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        draft: { type: DataTypes.STRING(20), allowNull: false },
        sourceHash: { type: DataTypes.STRING(64), allowNull: false },
        testers: { type: DataTypes.INTEGER, allowNull: false },
        result: { type: DataTypes.JSONB, allowNull: false },
        changes: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        reports: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        computedAt: { type: DataTypes.DATE, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'finding_snapshots' },
    );
  }
}

/** The studio's decision about one finding (kind + direction) of a trial. */
export class FindingTriage extends Model<InferAttributes<FindingTriage>, InferCreationAttributes<FindingTriage>> {
  declare id: CreationOptional<string>;
  declare trialId: ForeignKey<Trial['id']>;
  declare kind: string;
  declare direction: 'add' | 'remove';
  declare state: TriageState;
  declare fixedInDraft: number | null;
  declare updatedById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    FindingTriage.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        kind: { type: DataTypes.STRING(320), allowNull: false },
        direction: { type: DataTypes.STRING(8), allowNull: false },
        state: { type: DataTypes.STRING(16), allowNull: false },
        fixedInDraft: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'finding_triage' },
    );
  }
}

/** A note by the grader or the designer on one finding. */
export class FindingNote extends Model<InferAttributes<FindingNote>, InferCreationAttributes<FindingNote>> {
  declare id: CreationOptional<string>;
  declare trialId: ForeignKey<Trial['id']>;
  declare kind: string;
  declare direction: 'add' | 'remove';
  declare authorId: ForeignKey<User['id']> | null;
  declare body: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    FindingNote.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        kind: { type: DataTypes.STRING(320), allowNull: false },
        direction: { type: DataTypes.STRING(8), allowNull: false },
        body: { type: DataTypes.TEXT, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'finding_notes' },
    );
  }
}

/** A coordinator's reading of an "other" alteration's words as a kind of the vocabulary. */
export class OtherAlterationMapping extends Model<InferAttributes<OtherAlterationMapping>, InferCreationAttributes<OtherAlterationMapping>> {
  declare id: CreationOptional<string>;
  declare trialId: ForeignKey<Trial['id']>;
  declare textKey: string;
  declare kind: string;
  declare mappedById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    OtherAlterationMapping.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        textKey: { type: DataTypes.STRING(300), allowNull: false },
        kind: { type: DataTypes.STRING(40), allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'other_alteration_mappings' },
    );
  }
}
