/**
 * An agency: the tenant every record belongs to, with its letterhead (for briefs) and the
 * storage key of its signing certificate. Table `agencies`.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

export class Agency extends Model<InferAttributes<Agency>, InferCreationAttributes<Agency>> {
  declare id: CreationOptional<number>
  declare name: string
  /** Short form used in tight places (header, file names), e.g. 'EUWS'. */
  declare shortName: string
  /** Postal address printed on the letterhead; may span lines. */
  declare address: CreationOptional<string>
  declare contactEmail: CreationOptional<string | null>
  declare phone: CreationOptional<string | null>
  /** Object-storage key of the letterhead logo, when uploaded. */
  declare logoStorageKey: CreationOptional<string | null>
  /** Object-storage key of the PKCS#12 certificate used to sign briefs, when set up. */
  declare signingCertificateStorageKey: CreationOptional<string | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare version: CreationOptional<number>

  static initModel(sequelize: Sequelize): typeof Agency {
    Agency.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      name: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      shortName: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      address: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      contactEmail: { type: DataTypes.TEXT, allowNull: true },
      phone: { type: DataTypes.TEXT, allowNull: true },
      logoStorageKey: { type: DataTypes.TEXT, allowNull: true },
      signingCertificateStorageKey: { type: DataTypes.TEXT, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    }, { sequelize, modelName: 'Agency', tableName: 'agencies', underscored: true, version: true })
    return Agency
  }
}
