/**
 * Subpopulation rows → SubpopulationDto (shared/atlas/types.ts), with the latest census, the
 * latest effective-size estimate, the working effective size and our status — computed here
 * once so the list, the record page and the exports all show the same figures.
 * Handlers never return model instances.
 */
import { QueryTypes, type Sequelize, type Transaction, type WhereOptions } from 'sequelize'
import type { Species, Subpopulation, Models } from '../db/models'
import type { LatestCensusDto, LatestEstimateDto, SpeciesDto, SubpopulationDto } from '#shared/atlas/types'
import { subpopulationStatus, workingEffectiveSize } from '#shared/atlas/working-effective-size'

const iso = (date: Date | null | undefined): string => (date ? new Date(date).toISOString() : '')

/** The figures a DTO needs beyond the row itself. */
export interface LatestFigures {
  census: LatestCensusDto | null
  estimate: LatestEstimateDto | null
}

/**
 * One subpopulation as JSON.
 *
 * @param row - the model instance (or any object with its attributes)
 * @param latest - latest census and estimate (null when none)
 */
export function subpopulationDto(row: Subpopulation, latest: LatestFigures): SubpopulationDto {
  const effectiveSize = workingEffectiveSize({
    workingNe: row.workingNe ?? null,
    workingNeReason: row.workingNeReason ?? null,
    latestEstimate: latest.estimate,
    latestCensus: latest.census,
  })
  return {
    id: row.id,
    speciesId: row.speciesId,
    name: row.name,
    geometry: row.geometry ?? null,
    centroid: row.centroidLon !== null && row.centroidLon !== undefined && row.centroidLat !== null && row.centroidLat !== undefined
      ? { lon: row.centroidLon, lat: row.centroidLat }
      : null,
    areaKm2: row.areaKm2 ?? null,
    environmentClass: row.environmentClass ?? null,
    yearsIsolated: row.yearsIsolated ?? null,
    generationTimeYears: row.generationTimeYears,
    workingNe: row.workingNe ?? null,
    workingNeReason: row.workingNeReason ?? null,
    notes: row.notes ?? '',
    latestCensus: latest.census,
    latestEstimate: latest.estimate,
    effectiveSize,
    status: subpopulationStatus(effectiveSize),
    createdAt: iso(row.createdAt),
    updatedAt: iso(row.updatedAt),
    version: row.version ?? 0,
  }
}

/** What the audit log keeps of a subpopulation (attributes and boundary, no derived status). */
export function subpopulationAuditSnapshot(row: Subpopulation): Record<string, unknown> {
  return {
    id: row.id,
    speciesId: row.speciesId,
    name: row.name,
    geometry: row.geometry ?? null,
    areaKm2: row.areaKm2 ?? null,
    environmentClass: row.environmentClass ?? null,
    yearsIsolated: row.yearsIsolated ?? null,
    generationTimeYears: row.generationTimeYears,
    workingNe: row.workingNe ?? null,
    workingNeReason: row.workingNeReason ?? null,
    notes: row.notes ?? '',
    version: row.version ?? 0,
  }
}

interface CensusRow { subpopulation_id: number, year: number, adults: number }
interface EstimateRow { id: number, subpopulation_id: number, method: string, value: number, estimated_on: string | null }

/**
 * Latest census (by year) and latest effective-size estimate (by date, then entry) of each
 * subpopulation, two queries for any number of them.
 */
export async function latestFiguresOf(sequelize: Sequelize, ids: readonly number[], transaction?: Transaction): Promise<Map<number, LatestFigures>> {
  const figures = new Map<number, LatestFigures>(ids.map(id => [id, { census: null, estimate: null }]))
  if (!ids.length) return figures
  const censusRows = await sequelize.query<CensusRow>(
    `SELECT DISTINCT ON (subpopulation_id) subpopulation_id, year, adults
       FROM census_counts WHERE subpopulation_id IN (:ids)
      ORDER BY subpopulation_id, year DESC`,
    { replacements: { ids: [...ids] }, type: QueryTypes.SELECT, transaction },
  )
  const estimateRows = await sequelize.query<EstimateRow>(
    `SELECT DISTINCT ON (subpopulation_id) id, subpopulation_id, method, value,
            to_char(estimated_on, 'YYYY-MM-DD') AS estimated_on
       FROM effective_size_estimates WHERE subpopulation_id IN (:ids)
      ORDER BY subpopulation_id, estimated_on DESC NULLS LAST, created_at DESC, id DESC`,
    { replacements: { ids: [...ids] }, type: QueryTypes.SELECT, transaction },
  )
  for (const row of censusRows) {
    const entry = figures.get(row.subpopulation_id)
    if (entry) entry.census = { year: Number(row.year), adults: Number(row.adults) }
  }
  for (const row of estimateRows) {
    const entry = figures.get(row.subpopulation_id)
    if (entry) entry.estimate = { id: Number(row.id), method: row.method, value: Number(row.value), estimatedOn: row.estimated_on }
  }
  return figures
}

/**
 * Subpopulations matching `where` (always include the agency) as DTOs, by name.
 *
 * @param db - the connection and models
 * @param where - Sequelize where on Subpopulation, e.g. `{ agencyId, speciesId }`
 */
export async function loadSubpopulationDtos(
  db: { sequelize: Sequelize, models: Models },
  where: WhereOptions<Subpopulation> & { agencyId: number },
  transaction?: Transaction,
): Promise<SubpopulationDto[]> {
  const rows = await db.models.Subpopulation.findAll({ where, order: [['name', 'ASC'], ['id', 'ASC']], transaction })
  return dtosOf(db.sequelize, rows, transaction)
}

/** DTOs of rows already loaded (one query each for censuses and estimates). */
export async function dtosOf(sequelize: Sequelize, rows: readonly Subpopulation[], transaction?: Transaction): Promise<SubpopulationDto[]> {
  const figures = await latestFiguresOf(sequelize, rows.map(row => row.id), transaction)
  return rows.map(row => subpopulationDto(row, figures.get(row.id) ?? { census: null, estimate: null }))
}

/** One species as JSON. */
export function speciesDto(species: Species, subpopulationCount: number): SpeciesDto {
  return {
    id: species.id,
    commonName: species.commonName,
    scientificName: species.scientificName,
    notes: species.notes ?? '',
    invented: Boolean(species.invented),
    subpopulationCount,
    version: species.version ?? 0,
  }
}
