/** Census row → JSON (shape in shared/schemas/census.ts); handlers never return the model. */
import type { CensusCount } from '../db/models'
import type { CensusCountDto } from '#shared/schemas/census'

export function censusCountDto(row: CensusCount): CensusCountDto {
  return {
    id: row.id,
    subpopulationId: row.subpopulationId,
    year: row.year,
    adults: row.adults,
    males: row.males ?? null,
    females: row.females ?? null,
    method: row.method ?? '',
    source: row.source ?? '',
    updatedAt: new Date(row.updatedAt).toISOString(),
    version: row.version,
  }
}
