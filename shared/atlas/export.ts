/**
 * Export of a species' subpopulations as GeoJSON (boundaries + attributes + status) and as CSV
 * (one row per subpopulation, its centroid as latitude/longitude). Both files can be imported
 * again: the importer reads name, environment class, generation time, years isolated and
 * notes, and ignores the derived columns.
 */
import Papa from 'papaparse'
import type { Feature, FeatureCollection } from 'geojson'
import type { SubpopulationDto, SubpopulationGeometry } from './types'

/** Properties of each exported feature. */
export interface ExportProperties {
  id: number
  name: string
  environmentClass: string | null
  generationTimeYears: number
  yearsIsolated: number | null
  areaKm2: number | null
  workingNe: number | null
  workingNeReason: string | null
  latestCensusYear: number | null
  latestCensusAdults: number | null
  effectiveSize: number | null
  effectiveSizeBasis: string
  status: string
  projectedInbreeding: number | null
  projectionGenerations: number
  notes: string
}

function propertiesOf(item: SubpopulationDto): ExportProperties {
  return {
    id: item.id,
    name: item.name,
    environmentClass: item.environmentClass,
    generationTimeYears: item.generationTimeYears,
    yearsIsolated: item.yearsIsolated,
    areaKm2: item.areaKm2,
    workingNe: item.workingNe,
    workingNeReason: item.workingNeReason,
    latestCensusYear: item.latestCensus?.year ?? null,
    latestCensusAdults: item.latestCensus?.adults ?? null,
    effectiveSize: item.effectiveSize.value,
    effectiveSizeBasis: item.effectiveSize.basis,
    status: item.status.label,
    projectedInbreeding: item.status.projectedInbreeding,
    projectionGenerations: item.status.generations,
    notes: item.notes,
  }
}

/**
 * A FeatureCollection of the subpopulations (those without a boundary get a null geometry,
 * as RFC 7946 allows).
 *
 * @param items - subpopulations, in the order to write them
 * @returns the collection, ready for JSON.stringify
 */
export function subpopulationsToGeoJson(items: readonly SubpopulationDto[]): FeatureCollection<SubpopulationGeometry | null, ExportProperties> {
  const features: Feature<SubpopulationGeometry | null, ExportProperties>[] = items.map(item => ({
    type: 'Feature',
    id: item.id,
    geometry: item.geometry,
    properties: propertiesOf(item),
  }))
  // RFC 7946 allows a null geometry; the typings of 'geojson' want Geometry, hence the cast.
  return { type: 'FeatureCollection', features } as FeatureCollection<SubpopulationGeometry | null, ExportProperties>
}

/** Column order of the CSV export (snake_case, as the importer expects). */
export const CSV_EXPORT_COLUMNS = [
  'id', 'name', 'latitude', 'longitude', 'environment_class', 'generation_time_years', 'years_isolated',
  'area_km2', 'geometry_type', 'working_ne', 'working_ne_reason', 'latest_census_year', 'latest_census_adults',
  'effective_size', 'effective_size_basis', 'status', 'projected_f', 'projection_generations', 'notes',
] as const

/**
 * A CSV of the subpopulations: one row each, the centroid as latitude/longitude. Text that a
 * spreadsheet would run as a formula (=, +, -, @ at the start) is prefixed with an apostrophe.
 *
 * @param items - subpopulations, in the order to write them
 * @returns CSV text with a header row and CRLF line ends
 */
export function subpopulationsToCsv(items: readonly SubpopulationDto[]): string {
  const rows = items.map((item) => {
    const p = propertiesOf(item)
    return [
      p.id, p.name, item.centroid?.lat ?? null, item.centroid?.lon ?? null, p.environmentClass, p.generationTimeYears,
      p.yearsIsolated, p.areaKm2, item.geometry?.type ?? null, p.workingNe, p.workingNeReason, p.latestCensusYear,
      p.latestCensusAdults, p.effectiveSize, p.effectiveSizeBasis, p.status, p.projectedInbreeding,
      p.projectionGenerations, p.notes,
    ]
  })
  return Papa.unparse({ fields: [...CSV_EXPORT_COLUMNS], data: rows }, { escapeFormulae: true, newline: '\r\n' })
}

/**
 * A file name from a species name: 'Mistridge salamander' → 'mistridge-salamander-subpopulations.csv'.
 *
 * @example exportFileName('Mistridge salamander', 'csv') // 'mistridge-salamander-subpopulations.csv'
 */
export function exportFileName(speciesName: string, extension: 'csv' | 'geojson'): string {
  const slug = speciesName.normalize('NFKD').replace(/[\u0300-\u036f]/g, '').toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '') || 'species'
  return `${slug}-subpopulations.${extension}`
}
