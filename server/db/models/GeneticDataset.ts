/**
 * An uploaded genotype table for a subpopulation (the file sits in object storage under
 * `storageKey`) and the summary computed from it (Ho, He, F_IS, allelic richness …).
 * Table `genetic_datasets`.
 */
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import { GENETIC_DATASET_FORMATS, MARKER_TYPES, type GeneticDatasetFormat, type MarkerType } from '../../../shared/types/db'
import type { Subpopulation } from './Subpopulation'

export class GeneticDataset extends Model<InferAttributes<GeneticDataset>, InferCreationAttributes<GeneticDataset>> {
  declare id: CreationOptional<number>
  declare subpopulationId: number
  declare storageKey: string
  declare fileName: string
  declare format: GeneticDatasetFormat
  declare markerType: MarkerType
  /** Year the samples were taken, when known. */
  declare sampledYear: CreationOptional<number | null>
  /** Computed summary statistics; null until computed. */
  declare summary: CreationOptional<Record<string, unknown> | null>
  declare createdBy: CreationOptional<number | null>
  /** File size in bytes (BIGINT; read back as a number). */
  declare sizeBytes: number
  declare checksumSha256: string
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare version: CreationOptional<number>

  declare subpopulation?: NonAttribute<Subpopulation>

  static initModel(sequelize: Sequelize): typeof GeneticDataset {
    GeneticDataset.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      subpopulationId: { type: DataTypes.INTEGER, allowNull: false },
      storageKey: { type: DataTypes.TEXT, allowNull: false },
      fileName: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      format: { type: DataTypes.TEXT, allowNull: false, validate: { isIn: [[...GENETIC_DATASET_FORMATS]] } },
      markerType: { type: DataTypes.TEXT, allowNull: false, validate: { isIn: [[...MARKER_TYPES]] } },
      sampledYear: { type: DataTypes.INTEGER, allowNull: true },
      summary: { type: DataTypes.JSONB, allowNull: true },
      createdBy: { type: DataTypes.INTEGER, allowNull: true },
      sizeBytes: {
        type: DataTypes.BIGINT,
        allowNull: false,
        // pg returns BIGINT as a string; sizes stay far below 2^53.
        get(): number {
          return Number(this.getDataValue('sizeBytes'))
        },
      },
      checksumSha256: { type: DataTypes.TEXT, allowNull: false, validate: { is: /^[0-9a-f]{64}$/ } },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    }, { sequelize, modelName: 'GeneticDataset', tableName: 'genetic_datasets', underscored: true, version: true })
    return GeneticDataset
  }
}
