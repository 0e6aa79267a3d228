// A mail waiting in (or sent from) the outgoing queue; the mail worker sends it.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';

export class MailOutbox extends Model<InferAttributes<MailOutbox>, InferCreationAttributes<MailOutbox>> {
  declare id: CreationOptional<number>;
  declare kind: string;
  declare toAddress: string | null;
  declare subject: string;
  declare textBody: string;
  declare headers: CreationOptional<Record<string, string>>;
  declare dedupeKey: CreationOptional<string | null>;
  declare scrubAfterSend: CreationOptional<boolean>;
  declare state: CreationOptional<'queued' | 'sent' | 'failed'>;
  declare attempts: CreationOptional<number>;
  declare nextAttemptAt: CreationOptional<Date>;
  declare lastError: CreationOptional<string | null>;
  declare sentAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
}

MailOutbox.init(
  {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    kind: { type: DataTypes.TEXT, allowNull: false },
    toAddress: DataTypes.TEXT,
    subject: { type: DataTypes.TEXT, allowNull: false },
    textBody: { type: DataTypes.TEXT, allowNull: false },
    headers: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    dedupeKey: DataTypes.TEXT,
    scrubAfterSend: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    state: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'queued' },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    nextAttemptAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    lastError: DataTypes.TEXT,
    sentAt: DataTypes.DATE,
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'mail_outbox', updatedAt: false },
);
