/**
 * A signed brief as it was issued on approval: the PDF bytes exactly as signed, their SHA-256,
 * the document ID printed in the file, who signed and when. Append-only (a trigger refuses
 * UPDATE and DELETE); one per proposal. Table `issued_briefs` (migration 0006).
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

export class IssuedBrief extends Model<InferAttributes<IssuedBrief>, InferCreationAttributes<IssuedBrief>> {
  declare id: CreationOptional<number>
  declare agencyId: number
  declare proposalId: number
  /** UUID printed on every page of the brief. */
  declare documentId: string
  /** SHA-256 of the signed file, lower-case hex. */
  declare sha256: string
  /** The signed PDF, unchanged. */
  declare pdf: Buffer
  declare sizeBytes: number
  /** Subject of the signing certificate, e.g. 'CN=Eastern Uplands Wildlife Service, O=…'. */
  declare signerSubject: string
  declare signerFingerprintSha256: string
  declare signedAt: Date
  /** The approver whose decision issued it (null for the system). */
  declare issuedBy: number | null
  declare createdAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize): typeof IssuedBrief {
    IssuedBrief.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      agencyId: { type: DataTypes.INTEGER, allowNull: false },
      proposalId: { type: DataTypes.INTEGER, allowNull: false },
      documentId: { type: DataTypes.UUID, allowNull: false },
      sha256: { type: DataTypes.TEXT, allowNull: false, validate: { is: /^[0-9a-f]{64}$/ } },
      pdf: { type: DataTypes.BLOB, allowNull: false },
      sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
      signerSubject: { type: DataTypes.TEXT, allowNull: false },
      signerFingerprintSha256: { type: DataTypes.TEXT, allowNull: false },
      signedAt: { type: DataTypes.DATE, allowNull: false },
      issuedBy: { type: DataTypes.INTEGER, allowNull: true },
      createdAt: DataTypes.DATE,
    }, { sequelize, modelName: 'IssuedBrief', tableName: 'issued_briefs', underscored: true, updatedAt: false })
    return IssuedBrief
  }
}
