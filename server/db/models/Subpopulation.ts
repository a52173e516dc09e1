/**
 * A managed subpopulation of a species: its boundary, size of habitat, environment, isolation
 * history, generation time and the working effective size used in projections.
 * Table `subpopulations`.
 *
 * Units: `areaKm2` in km² (geodesic, from the geometry), `yearsIsolated` and
 * `generationTimeYears` in years, `workingNe` in individuals. `geometry` is a GeoJSON
 * Polygon, MultiPolygon or Point in WGS 84 (lon, lat); `centroidLon`/`centroidLat` are
 * derived from it (both null or both set).
 */
import type { MultiPolygon, Point, Polygon } from 'geojson'
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { CensusCount } from './CensusCount'
import type { EffectiveSizeEstimate } from './EffectiveSizeEstimate'
import type { GeneticDataset } from './GeneticDataset'
import type { Species } from './Species'

export type SubpopulationGeometry = Polygon | MultiPolygon | Point

export class Subpopulation extends Model<InferAttributes<Subpopulation>, InferCreationAttributes<Subpopulation>> {
  declare id: CreationOptional<number>
  declare agencyId: number
  declare speciesId: number
  declare name: string
  declare geometry: CreationOptional<SubpopulationGeometry | null>
  declare centroidLon: CreationOptional<number | null>
  declare centroidLat: CreationOptional<number | null>
  declare areaKm2: CreationOptional<number | null>
  /** Habitat or environment class, free text (e.g. 'spruce-fir summit'). */
  declare environmentClass: CreationOptional<string | null>
  declare yearsIsolated: CreationOptional<number | null>
  declare generationTimeYears: number
  /** The effective size the team works with; requires `workingNeReason`. */
  declare workingNe: CreationOptional<number | null>
  declare workingNeReason: CreationOptional<string | null>
  /** The saved estimate the working Ne was taken from, who chose it and when (migration 0003). */
  declare workingNeEstimateId: CreationOptional<number | null>
  declare workingNeSetBy: CreationOptional<number | null>
  declare workingNeSetAt: CreationOptional<Date | null>
  declare notes: CreationOptional<string>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare version: CreationOptional<number>

  declare species?: NonAttribute<Species>
  declare censusCounts?: NonAttribute<CensusCount[]>
  declare effectiveSizeEstimates?: NonAttribute<EffectiveSizeEstimate[]>
  declare geneticDatasets?: NonAttribute<GeneticDataset[]>

  static initModel(sequelize: Sequelize): typeof Subpopulation {
    Subpopulation.init({
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      agencyId: { type: DataTypes.INTEGER, allowNull: false },
      speciesId: { type: DataTypes.INTEGER, allowNull: false },
      name: { type: DataTypes.TEXT, allowNull: false, validate: { notEmpty: true } },
      geometry: { type: DataTypes.JSONB, allowNull: true },
      centroidLon: { type: DataTypes.DOUBLE, allowNull: true, validate: { min: -180, max: 180 } },
      centroidLat: { type: DataTypes.DOUBLE, allowNull: true, validate: { min: -90, max: 90 } },
      areaKm2: { type: DataTypes.DOUBLE, allowNull: true, validate: { min: 0 } },
      environmentClass: { type: DataTypes.TEXT, allowNull: true },
      yearsIsolated: { type: DataTypes.DOUBLE, allowNull: true, validate: { min: 0 } },
      generationTimeYears: { type: DataTypes.DOUBLE, allowNull: false },
      workingNe: { type: DataTypes.DOUBLE, allowNull: true },
      workingNeReason: { type: DataTypes.TEXT, allowNull: true },
      workingNeEstimateId: { type: DataTypes.INTEGER, allowNull: true },
      workingNeSetBy: { type: DataTypes.INTEGER, allowNull: true },
      workingNeSetAt: { type: DataTypes.DATE, allowNull: true },
      notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    }, { sequelize, modelName: 'Subpopulation', tableName: 'subpopulations', underscored: true, version: true })
    return Subpopulation
  }
}
