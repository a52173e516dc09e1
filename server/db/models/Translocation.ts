/**
 * A translocation actually carried out under an approved proposal (migration 0007): the day,
 * the animals moved (id and sex of each), where from and where to, and who recorded it.
 * Table `translocations`. `sourceId` is null for a captive or other unrecorded source, named
 * in `sourceNote`.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { Proposal } from './Proposal'
import type { Subpopulation } from './Subpopulation'
import type { User } from './User'

/** Sex of a moved animal as recorded. */
export type AnimalSex = 'female' | 'male' | 'unknown'

/** One moved animal: the agency's own id for it (tag, transponder…) and its sex. */
export interface MovedAnimal { id: string, sex: AnimalSex }

export class Translocation extends Model<InferAttributes<Translocation>, InferCreationAttributes<Translocation>> {
  declare id: CreationOptional<number>
  declare proposalId: number
  /** The day of the move, 'YYYY-MM-DD'. */
  declare movedOn: string
  declare sourceId: CreationOptional<number | null>
  declare sourceNote: CreationOptional<string>
  declare recipientId: number
  declare animals: MovedAnimal[]
  declare notes: CreationOptional<string>
  declare recordedBy: number
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare version: CreationOptional<number>

  declare proposal?: NonAttribute<Proposal>
  declare source?: NonAttribute<Subpopulation | null>
  declare recipient?: NonAttribute<Subpopulation>
  declare recorder?: NonAttribute<User>

  static initModel(sequelize: Sequelize): typeof Translocation {
    Translocation.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      proposalId: { type: DataTypes.INTEGER, allowNull: false },
      movedOn: { type: DataTypes.DATEONLY, allowNull: false },
      sourceId: { type: DataTypes.INTEGER, allowNull: true },
      sourceNote: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      recipientId: { type: DataTypes.INTEGER, allowNull: false },
      animals: { type: DataTypes.JSONB, allowNull: false },
      notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      recordedBy: { type: DataTypes.INTEGER, allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    }, { sequelize, modelName: 'Translocation', tableName: 'translocations', underscored: true, version: true })
    return Translocation
  }
}
