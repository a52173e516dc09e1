/**
 * An estimate of a subpopulation's effective size (Ne, individuals) with its method, the
 * inputs it was computed from and where it comes from. Table `effective_size_estimates`.
 *
 * Invariants (CHECK constraints): value > 0; 0 ≤ intervalLow ≤ value ≤ intervalHigh when given
 * (intervalHigh may be Infinity, as linkage-disequilibrium estimates often are); source not
 * blank.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { Subpopulation } from './Subpopulation'

export class EffectiveSizeEstimate extends Model<InferAttributes<EffectiveSizeEstimate>, InferCreationAttributes<EffectiveSizeEstimate>> {
  declare id: CreationOptional<number>
  declare subpopulationId: number
  /** Method slug, usually one of EFFECTIVE_SIZE_METHODS (shared/types/db.ts). */
  declare method: string
  /** The figures the estimate was computed from, shaped by the method. */
  declare inputs: CreationOptional<Record<string, unknown>>
  declare value: number
  declare intervalLow: CreationOptional<number | null>
  declare intervalHigh: CreationOptional<number | null>
  /** Calendar date (YYYY-MM-DD) of the estimate. */
  declare estimatedOn: CreationOptional<string | null>
  declare source: string
  declare createdBy: CreationOptional<number | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare version: CreationOptional<number>

  declare subpopulation?: NonAttribute<Subpopulation>

  static initModel(sequelize: Sequelize): typeof EffectiveSizeEstimate {
    EffectiveSizeEstimate.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      subpopulationId: { type: DataTypes.INTEGER, allowNull: false },
      method: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      inputs: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      value: { type: DataTypes.DOUBLE, allowNull: false },
      intervalLow: { type: DataTypes.DOUBLE, allowNull: true },
      intervalHigh: { type: DataTypes.DOUBLE, allowNull: true },
      estimatedOn: { type: DataTypes.DATEONLY, allowNull: true },
      source: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      createdBy: { type: DataTypes.INTEGER, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    }, { sequelize, modelName: 'EffectiveSizeEstimate', tableName: 'effective_size_estimates', underscored: true, version: true })
    return EffectiveSizeEstimate
  }
}
