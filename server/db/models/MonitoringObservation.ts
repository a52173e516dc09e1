/**
 * A follow-up observation of a proposal's recipient after approval (migration 0007): census
 * (adults), heterozygosity and/or inbreeding F on one day, from a named source (survey,
 * genotyping report …). Table `monitoring_observations`; at least one figure is set (CHECK).
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { Proposal } from './Proposal'
import type { User } from './User'

export class MonitoringObservation extends Model<InferAttributes<MonitoringObservation>, InferCreationAttributes<MonitoringObservation>> {
  declare id: CreationOptional<number>
  declare proposalId: number
  /** The subpopulation observed (the proposal's recipient). */
  declare subpopulationId: number
  /** 'YYYY-MM-DD'. */
  declare observedOn: string
  declare census: CreationOptional<number | null>
  declare heterozygosity: CreationOptional<number | null>
  declare inbreeding: CreationOptional<number | null>
  declare source: string
  declare notes: CreationOptional<string>
  declare recordedBy: number
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare version: CreationOptional<number>

  declare proposal?: NonAttribute<Proposal>
  declare recorder?: NonAttribute<User>

  static initModel(sequelize: Sequelize): typeof MonitoringObservation {
    MonitoringObservation.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      proposalId: { type: DataTypes.INTEGER, allowNull: false },
      subpopulationId: { type: DataTypes.INTEGER, allowNull: false },
      observedOn: { type: DataTypes.DATEONLY, allowNull: false },
      census: { type: DataTypes.INTEGER, allowNull: true },
      heterozygosity: { type: DataTypes.DOUBLE, allowNull: true },
      inbreeding: { type: DataTypes.DOUBLE, allowNull: true },
      source: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      recordedBy: { type: DataTypes.INTEGER, allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    }, { sequelize, modelName: 'MonitoringObservation', tableName: 'monitoring_observations', underscored: true, version: true })
    return MonitoringObservation
  }
}
