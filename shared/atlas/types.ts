/**
 * JSON shapes of the Atlas routes (server/api/species/**, server/api/subpopulations/**).
 * Dates are ISO 8601 strings; geometry is GeoJSON in WGS 84 (longitude, latitude in degrees).
 * The server maps models to these in server/atlas/subpopulation-dto.ts; the client never sees
 * a model. Used by the Atlas, the subpopulation page and the proposal builder.
 */
import type { MultiPolygon, Point, Polygon } from 'geojson'
import type { SubpopulationStatus, WorkingEffectiveSize } from './working-effective-size'

/** A subpopulation boundary: one or several polygons, or a point when only a place is known. */
export type SubpopulationGeometry = Polygon | MultiPolygon | Point

/** A species of the agency (GET /api/species, GET /api/species/:id). */
export interface SpeciesDto {
  id: number
  commonName: string
  scientificName: string
  notes: string
  /** Demo or training record: screens say so. */
  invented: boolean
  subpopulationCount: number
  version: number
}

/** GET /api/species */
export interface SpeciesListResponse { items: SpeciesDto[] }

/** The latest census row of a subpopulation. */
export interface LatestCensusDto { year: number, adults: number }

/** The latest effective-size estimate of a subpopulation. */
export interface LatestEstimateDto { id: number, method: string, value: number, estimatedOn: string | null }

/**
 * One subpopulation as the Atlas and the other pages read it (GET /api/subpopulations,
 * GET /api/subpopulations/:id, and the answers of POST and PATCH).
 */
export interface SubpopulationDto {
  id: number
  speciesId: number
  name: string
  geometry: SubpopulationGeometry | null
  /** Centre of mass of the boundary (or the point); null without geometry. */
  centroid: { lon: number, lat: number } | null
  /** Geodesic area in km² (0 for a point); null without geometry. */
  areaKm2: number | null
  environmentClass: string | null
  yearsIsolated: number | null
  generationTimeYears: number
  /** The working Ne the team chose (individuals), with its reason; null when not chosen. */
  workingNe: number | null
  workingNeReason: string | null
  notes: string
  latestCensus: LatestCensusDto | null
  latestEstimate: LatestEstimateDto | null
  /** The effective size the status is projected from (working Ne, else latest estimate, else 0.1 × census). */
  effectiveSize: WorkingEffectiveSize
  /** Our status scale (shared/atlas/status.ts). */
  status: SubpopulationStatus
  createdAt: string
  updatedAt: string
  /** Send back with PATCH and DELETE (optimistic locking). */
  version: number
}

/** GET /api/subpopulations?speciesId= */
export interface SubpopulationListResponse { items: SubpopulationDto[] }

/** GET /api/subpopulations/:id — the record with its species and how many proposals use it. */
export interface SubpopulationDetailDto extends SubpopulationDto {
  species: { id: number, commonName: string, scientificName: string, invented: boolean }
  /** Proposals naming it as recipient or source (any state). */
  proposalCount: number
}

/** One problem of an import, tied to its feature or row. */
export interface ImportIssue {
  /** Machine path: 'features.2.geometry', 'rows.4.latitude', '' for the whole file. */
  path: string
  /** A sentence that names the feature or row ("Feature 3 …", "Row 5 …"). */
  message: string
  /** 1-based feature number (GeoJSON), when the problem belongs to one. */
  feature?: number
  /** Spreadsheet row number (the header is row 1), when the problem belongs to one. */
  row?: number
}

/** POST /api/species/:id/subpopulations/import → 201 */
export interface ImportResponse {
  created: number
  updated: number
  items: SubpopulationDto[]
}

/** Distances between two subpopulations, in km. */
export interface DistancePair {
  /** Great-circle distance between the centroids. */
  centroidKm: number
  /** Great-circle distance between the nearest points of the boundaries (0 when they touch or overlap). */
  edgeKm: number
}

/** One subpopulation's nearest neighbour (by nearest edges). */
export interface NearestNeighbour {
  id: number
  neighbourId: number | null
  centroidKm: number | null
  edgeKm: number | null
}

/** GET /api/species/:id/distances */
export interface DistanceMatrixResponse {
  /** Subpopulations with a geometry, in matrix order (by name). */
  items: { id: number, name: string }[]
  /** centroidKm[i][j], symmetric, 0 on the diagonal; null when the matrix was left out (too many). */
  centroidKm: number[][] | null
  edgeKm: number[][] | null
  nearest: NearestNeighbour[]
  /** Subpopulations left out because they have no geometry. */
  withoutGeometry: { id: number, name: string }[]
  method: string
}
