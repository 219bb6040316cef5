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
import type { Milestone } from './milestone';
import type { Pattern } from './pattern';
import type { Studio } from './studio';

export type TrialState = 'draft' | 'open' | 'running' | 'closed';
export type StoredCoverage = {
  sizes: { sizeId: string; target: number }[];
  heightBands: { id: string; label: string; minMm: number | null; maxMm: number | null }[];
  variants: string[];
};

export class Trial extends Model<InferAttributes<Trial>, InferCreationAttributes<Trial>> {
  declare id: CreationOptional<string>;
  declare studioId: ForeignKey<Studio['id']>;
  declare patternId: ForeignKey<Pattern['id']>;
  declare slug: string;
  declare title: string;
  declare callText: CreationOptional<string>;
  declare requirements: CreationOptional<string>;
  declare state: CreationOptional<TrialState>;
  declare coverage: CreationOptional<StoredCoverage>;
  declare releasedAt: CreationOptional<Date | null>;
  declare releasedById: CreationOptional<string | null>;
  declare finalDraftId: CreationOptional<string | null>;
  declare coverageGapNote: CreationOptional<string | null>;
  declare releaseOpenItems: CreationOptional<{ key: string; title: string; detail: string }[] | null>;
  declare copiedFromId: CreationOptional<string | null>;
  declare photosRemovedAt: CreationOptional<Date | null>;
  /** Bumped by the database on every write the findings depend on (see migration 0030). */
  declare findingsRevision: CreationOptional<string>;
  /** The revision the stored findings were computed from; fresh while it equals findingsRevision. */
  declare findingsComputedRevision: CreationOptional<string>;
  declare findingsConfigHash: CreationOptional<string | null>;
  declare findingsComputedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare milestones?: NonAttribute<Milestone[]>;
  declare pattern?: NonAttribute<Pattern>;
  declare studio?: NonAttribute<Studio>;

  static initModel(sequelize: Sequelize) {
    Trial.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        slug: { type: DataTypes.STRING(90), allowNull: false, unique: true },
        title: { type: DataTypes.STRING(160), allowNull: false },
        callText: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        requirements: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        state: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'draft' },
        coverage: { type: DataTypes.JSONB, allowNull: false, defaultValue: { sizes: [], heightBands: [], variants: [] } },
        releasedAt: { type: DataTypes.DATE, allowNull: true },
        releasedById: { type: DataTypes.UUID, allowNull: true },
        finalDraftId: { type: DataTypes.UUID, allowNull: true },
        coverageGapNote: { type: DataTypes.STRING(2000), allowNull: true },
        releaseOpenItems: { type: DataTypes.JSONB, allowNull: true },
        copiedFromId: { type: DataTypes.UUID, allowNull: true },
        photosRemovedAt: { type: DataTypes.DATE, allowNull: true },
        // BIGINT comes back from pg as a string; compared as strings, never written by the app.
        findingsRevision: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 1 },
        findingsComputedRevision: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
        findingsConfigHash: { type: DataTypes.STRING(64), allowNull: true },
        findingsComputedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'trials' },
    );
  }
}
