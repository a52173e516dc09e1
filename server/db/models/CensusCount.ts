/**
 * One year's census of a subpopulation: adults counted, and males and females when known.
 * One row per subpopulation and year. Table `census_counts`.
 *
 * Invariants (CHECK constraints): all counts ≥ 0; males ≤ adults, females ≤ adults and
 * males + females ≤ adults when both are given (some adults may be unsexed).
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { Subpopulation } from './Subpopulation'

export class CensusCount extends Model<InferAttributes<CensusCount>, InferCreationAttributes<CensusCount>> {
  declare id: CreationOptional<number>
  declare subpopulationId: number
  declare year: number
  declare adults: number
  declare males: CreationOptional<number | null>
  declare females: CreationOptional<number | null>
  /** How the count was made (e.g. 'mark-recapture', 'transect count'). */
  declare method: CreationOptional<string>
  /** Where the figure comes from (report, survey, person). */
  declare source: CreationOptional<string>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare version: CreationOptional<number>

  declare subpopulation?: NonAttribute<Subpopulation>

  static initModel(sequelize: Sequelize): typeof CensusCount {
    CensusCount.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      subpopulationId: { type: DataTypes.INTEGER, allowNull: false },
      year: { type: DataTypes.INTEGER, allowNull: false },
      adults: { type: DataTypes.INTEGER, allowNull: false },
      males: { type: DataTypes.INTEGER, allowNull: true },
      females: { type: DataTypes.INTEGER, allowNull: true },
      method: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      source: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    }, { sequelize, modelName: 'CensusCount', tableName: 'census_counts', underscored: true, version: true })
    return CensusCount
  }
}
