/**
 * An e-mail waiting to be sent, or already sent. The app queues rows inside the transaction
 * that caused them (server/utils/mail.ts `queueMail`); the dispatcher picks rows with status
 * 'queued' and `nextAttemptAt` ≤ now, marks them 'sending', then 'sent' (with `sentAt`) or
 * back to 'queued' with a later `nextAttemptAt`, and 'failed' after its last attempt.
 * Table `outbox_messages`.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import { OUTBOX_STATUSES, type OutboxStatus } from '../../../shared/types/db'
import type { Agency } from './Agency'

/** A file attached to a queued e-mail, stored with the row until it is sent. */
export interface OutboxAttachment {
  filename: string
  contentType: string
  contentBase64: string
}

export class OutboxMessage extends Model<InferAttributes<OutboxMessage>, InferCreationAttributes<OutboxMessage>> {
  declare id: CreationOptional<number>
  declare agencyId: CreationOptional<number | null>
  declare toAddress: string
  declare subject: string
  declare textBody: string
  declare htmlBody: CreationOptional<string | null>
  declare status: CreationOptional<OutboxStatus>
  declare attempts: CreationOptional<number>
  declare nextAttemptAt: CreationOptional<Date>
  declare lastError: CreationOptional<string | null>
  declare sentAt: CreationOptional<Date | null>
  /** Files sent with the message (migration 0006): [{ filename, contentType, contentBase64 }]. */
  declare attachments: CreationOptional<OutboxAttachment[]>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  declare agency?: NonAttribute<Agency | null>

  static initModel(sequelize: Sequelize): typeof OutboxMessage {
    OutboxMessage.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      agencyId: { type: DataTypes.INTEGER, allowNull: true },
      toAddress: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      subject: { type: DataTypes.TEXT, allowNull: false },
      textBody: { type: DataTypes.TEXT, allowNull: false },
      htmlBody: { type: DataTypes.TEXT, allowNull: true },
      status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'queued', validate: { isIn: [[...OUTBOX_STATUSES]] } },
      attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      nextAttemptAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      lastError: { type: DataTypes.TEXT, allowNull: true },
      sentAt: { type: DataTypes.DATE, allowNull: true },
      attachments: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    }, { sequelize, modelName: 'OutboxMessage', tableName: 'outbox_messages', underscored: true })
    return OutboxMessage
  }
}
