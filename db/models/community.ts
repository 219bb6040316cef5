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

import type { Trial } from './trial';
import type { User } from './user';

/** A reward (e.g. a discount code) the studio gives a finisher; one per finisher, sent once. */
export class RewardCode extends Model<InferAttributes<RewardCode>, InferCreationAttributes<RewardCode>> {
  declare id: CreationOptional<string>;
  declare trialId: ForeignKey<Trial['id']>;
  declare code: string;
  declare enrollmentId: CreationOptional<string | null>;
  declare assignedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    RewardCode.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        code: { type: DataTypes.STRING(200), allowNull: false },
        enrollmentId: { type: DataTypes.UUID, allowNull: true, unique: true },
        assignedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'reward_codes' },
    );
  }
}

export type AnnouncementAudience = { statuses: ('active' | 'finished' | 'dropped')[]; sizeIds: string[] };

/** A message from the studio to a trial's testers (all, or a filtered set), kept on the trial. */
export class Announcement extends Model<InferAttributes<Announcement>, InferCreationAttributes<Announcement>> {
  declare id: CreationOptional<string>;
  declare trialId: ForeignKey<Trial['id']>;
  declare authorId: string | null;
  declare subject: string;
  declare body: string;
  declare audience: CreationOptional<AnnouncementAudience>;
  declare replyTo: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare author?: NonAttribute<User | null>;
  declare recipients?: NonAttribute<AnnouncementRecipient[]>;

  static initModel(sequelize: Sequelize) {
    Announcement.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        authorId: { type: DataTypes.UUID, allowNull: true },
        subject: { type: DataTypes.STRING(200), allowNull: false },
        body: { type: DataTypes.TEXT, allowNull: false },
        audience: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        replyTo: { type: DataTypes.STRING(254), allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'announcements' },
    );
  }
}

export class AnnouncementRecipient extends Model<InferAttributes<AnnouncementRecipient>, InferCreationAttributes<AnnouncementRecipient>> {
  declare announcementId: string;
  declare userId: string;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    AnnouncementRecipient.init(
      {
        announcementId: { type: DataTypes.UUID, primaryKey: true },
        userId: { type: DataTypes.UUID, primaryKey: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'announcement_recipients', updatedAt: false },
    );
  }
}

/** A person from the studio's tester pool asked to apply to a call (they still apply). */
export class PoolInvitation extends Model<InferAttributes<PoolInvitation>, InferCreationAttributes<PoolInvitation>> {
  declare id: CreationOptional<string>;
  declare trialId: string;
  declare userId: string;
  declare invitedById: string | null;
  declare sentAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    PoolInvitation.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        trialId: { type: DataTypes.UUID, allowNull: false },
        userId: { type: DataTypes.UUID, allowNull: false },
        invitedById: { type: DataTypes.UUID, allowNull: true },
        sentAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'pool_invitations' },
    );
  }
}

/** A person's private calendar feed: its id and a signature of it make the secret address. */
export class CalendarFeed extends Model<InferAttributes<CalendarFeed>, InferCreationAttributes<CalendarFeed>> {
  declare id: CreationOptional<string>;
  declare userId: ForeignKey<User['id']>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    CalendarFeed.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        userId: { type: DataTypes.UUID, allowNull: false, unique: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'calendar_feeds' },
    );
  }
}


