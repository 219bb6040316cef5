import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { User } from './user';

export const OUTBOX_STATUSES = ['queued', 'sending', 'sent', 'failed', 'skipped', 'cancelled'] as const;
export type OutboxStatus = (typeof OUTBOX_STATUSES)[number];
/** Which preference turns a message off; essential mail (account and invitations) has none. */
export type MailCategory = 'essential' | 'trial-news' | 'reminders' | 'digest';

/** One e-mail Basted means to send, sent, or chose not to send, with every attempt's outcome. */
export class OutboxMessage extends Model<InferAttributes<OutboxMessage>, InferCreationAttributes<OutboxMessage>> {
  declare id: CreationOptional<string>;
  declare idempotencyKey: string;
  declare recipientId: string | null;
  declare recipientEmail: string;
  declare template: string;
  declare category: MailCategory;
  declare studioId: CreationOptional<string | null>;
  declare trialId: CreationOptional<string | null>;
  declare enrollmentId: CreationOptional<string | null>;
  declare milestoneKind: CreationOptional<string | null>;
  declare dueAt: CreationOptional<Date | null>;
  declare subject: string;
  declare text: string | null;
  declare html: string | null;
  declare headers: CreationOptional<Record<string, string>>;
  declare secret: CreationOptional<boolean>;
  declare status: CreationOptional<OutboxStatus>;
  declare attempts: CreationOptional<number>;
  declare nextAttemptAt: Date;
  declare claimedAt: CreationOptional<Date | null>;
  declare lastError: CreationOptional<string | null>;
  declare providerMessageId: CreationOptional<string | null>;
  declare sentAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare recipient?: NonAttribute<User>;

  static initModel(sequelize: Sequelize) {
    OutboxMessage.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        idempotencyKey: { type: DataTypes.STRING(200), allowNull: false, unique: true },
        recipientId: { type: DataTypes.UUID, allowNull: true },
        recipientEmail: { type: DataTypes.STRING(254), allowNull: false },
        template: { type: DataTypes.STRING(32), allowNull: false },
        category: { type: DataTypes.STRING(16), allowNull: false },
        studioId: { type: DataTypes.UUID, allowNull: true },
        trialId: { type: DataTypes.UUID, allowNull: true },
        enrollmentId: { type: DataTypes.UUID, allowNull: true },
        milestoneKind: { type: DataTypes.STRING(24), allowNull: true },
        dueAt: { type: DataTypes.DATE, allowNull: true },
        subject: { type: DataTypes.STRING(300), allowNull: false },
        text: { type: DataTypes.TEXT, allowNull: true },
        html: { type: DataTypes.TEXT, allowNull: true },
        headers: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        secret: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        status: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'queued' },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        nextAttemptAt: { type: DataTypes.DATE, allowNull: false },
        claimedAt: { type: DataTypes.DATE, allowNull: true },
        lastError: { type: DataTypes.TEXT, allowNull: true },
        providerMessageId: { type: DataTypes.STRING(300), allowNull: true },
        sentAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'outbox_messages' },
    );
  }
}
