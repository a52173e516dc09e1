/**
 * A species an agency manages. `invented` marks demo or training records so screens and
 * briefs can say so. Table `species`.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { Subpopulation } from './Subpopulation'

export class Species extends Model<InferAttributes<Species>, InferCreationAttributes<Species>> {
  declare id: CreationOptional<number>
  declare agencyId: number
  declare commonName: string
  declare scientificName: string
  declare notes: CreationOptional<string>
  declare invented: CreationOptional<boolean>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare version: CreationOptional<number>

  declare subpopulations?: NonAttribute<Subpopulation[]>

  static initModel(sequelize: Sequelize): typeof Species {
    Species.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      agencyId: { type: DataTypes.INTEGER, allowNull: false },
      commonName: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      scientificName: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      invented: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    }, { sequelize, modelName: 'Species', tableName: 'species', underscored: true, version: true })
    return Species
  }
}
