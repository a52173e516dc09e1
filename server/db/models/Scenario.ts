/**
 * One set of inputs for a proposal (schedule, variant, load …) whose results are computed by
 * the genetics engine. At most one scenario per proposal is the baseline (partial unique
 * index). Table `scenarios`.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { Proposal } from './Proposal'

export class Scenario extends Model<InferAttributes<Scenario>, InferCreationAttributes<Scenario>> {
  declare id: CreationOptional<number>
  declare proposalId: number
  declare name: string
  declare isBaseline: CreationOptional<boolean>
  declare inputs: CreationOptional<Record<string, unknown>>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare version: CreationOptional<number>

  declare proposal?: NonAttribute<Proposal>

  static initModel(sequelize: Sequelize): typeof Scenario {
    Scenario.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      proposalId: { type: DataTypes.INTEGER, allowNull: false },
      name: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      isBaseline: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      inputs: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    }, { sequelize, modelName: 'Scenario', tableName: 'scenarios', underscored: true, version: true })
    return Scenario
  }
}
