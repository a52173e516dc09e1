/**
 * A file attached to a record (permit, report, photo), stored in object storage under
 * `storageKey`. The owner is polymorphic: `ownerType` + `ownerId` (e.g. 'subpopulation', 12);
 * queries must also filter by `agencyId`. Table `attachments`.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import { ATTACHMENT_OWNER_TYPES, type AttachmentOwnerType } from '../../../shared/types/db'
import type { User } from './User'

export class Attachment extends Model<InferAttributes<Attachment>, InferCreationAttributes<Attachment>> {
  declare id: CreationOptional<number>
  declare agencyId: number
  declare ownerType: AttachmentOwnerType
  declare ownerId: number
  declare storageKey: string
  declare fileName: string
  declare contentType: string
  /** File size in bytes (BIGINT; read back as a number). */
  declare sizeBytes: number
  declare checksumSha256: string
  declare uploadedBy: CreationOptional<number | null>
  declare createdAt: CreationOptional<Date>

  declare uploader?: NonAttribute<User | null>

  static initModel(sequelize: Sequelize): typeof Attachment {
    Attachment.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      agencyId: { type: DataTypes.INTEGER, allowNull: false },
      ownerType: { type: DataTypes.TEXT, allowNull: false, validate: { isIn: [[...ATTACHMENT_OWNER_TYPES]] } },
      ownerId: { type: DataTypes.INTEGER, allowNull: false },
      storageKey: { type: DataTypes.TEXT, allowNull: false },
      fileName: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      contentType: { type: DataTypes.TEXT, allowNull: false },
      sizeBytes: {
        type: DataTypes.BIGINT,
        allowNull: false,
        // pg returns BIGINT as a string; sizes stay far below 2^53.
        get(): number {
          return Number(this.getDataValue('sizeBytes'))
        },
      },
      checksumSha256: { type: DataTypes.TEXT, allowNull: false, validate: { is: /^[0-9a-f]{64}$/ } },
      uploadedBy: { type: DataTypes.INTEGER, allowNull: true },
      createdAt: DataTypes.DATE,
    }, { sequelize, modelName: 'Attachment', tableName: 'attachments', underscored: true, updatedAt: false })
    return Attachment
  }
}
