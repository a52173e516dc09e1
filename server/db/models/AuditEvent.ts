/**
 * One entry of the audit log: who did what to which record, with the record before and after.
 * Append-only: a database trigger refuses UPDATE, DELETE and TRUNCATE on `audit_events`, so
 * only INSERT works (write through server/utils/audit.ts `recordAudit`).
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { User } from './User'

export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<number>
  declare agencyId: number
  /** Null for actions of the system itself (seeding, dispatcher). */
  declare actorId: CreationOptional<number | null>
  /** Dotted verb, e.g. 'user.invite', 'proposal.submit'. */
  declare action: string
  declare entityType: string
  declare entityId: CreationOptional<number | null>
  declare before: CreationOptional<Record<string, unknown> | null>
  declare after: CreationOptional<Record<string, unknown> | null>
  declare createdAt: CreationOptional<Date>

  declare actor?: NonAttribute<User | null>

  static initModel(sequelize: Sequelize): typeof AuditEvent {
    AuditEvent.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      agencyId: { type: DataTypes.INTEGER, allowNull: false },
      actorId: { type: DataTypes.INTEGER, allowNull: true },
      action: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      entityType: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      entityId: { type: DataTypes.INTEGER, allowNull: true },
      before: { type: DataTypes.JSONB, allowNull: true },
      after: { type: DataTypes.JSONB, allowNull: true },
      createdAt: DataTypes.DATE,
    }, { sequelize, modelName: 'AuditEvent', tableName: 'audit_events', underscored: true, updatedAt: false })
    return AuditEvent
  }
}
