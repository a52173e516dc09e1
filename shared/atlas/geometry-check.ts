/**
 * Checks a subpopulation boundary before it is saved, the same way in the browser (drawing,
 * import preview) and on the server (the zod schema in shared/schemas/subpopulation.ts):
 *   0. coordinates nested no deeper than the type needs (a hostile file nested thousands of
 *      levels deep would otherwise exhaust the stack in the structure check);
 *   1. GeoJSON structure and positions (@placemarkio/check-geojson: closed rings, four or more
 *      positions per ring, numeric positions, …);
 *   2. the type: Polygon, MultiPolygon or Point;
 *   3. coordinates on the globe: longitude −180…180, latitude −90…90;
 *   4. no self-intersection (turf `kinks`);
 *   5. a plausible area: MIN_AREA_KM2 to MAX_AREA_KM2 (points are exempt).
 * Each step runs only when the earlier ones found nothing.
 * Every problem is one plain sentence; the list is empty when the boundary is acceptable.
 */
import { getIssues } from '@placemarkio/check-geojson'
import { area, kinks } from '@turf/turf'
import type { MultiPolygon, Polygon, Position } from 'geojson'
import type { SubpopulationGeometry } from './types'

/** Smallest area a boundary may enclose, km² (1 000 m²: smaller is almost surely a slip). */
export const MIN_AREA_KM2 = 0.001
/** Largest area a boundary may enclose, km² (bigger than any managed subpopulation we expect). */
export const MAX_AREA_KM2 = 100_000

/** The geometry types a boundary may have. */
export const BOUNDARY_TYPES = ['Polygon', 'MultiPolygon', 'Point'] as const

/**
 * A position for people: "35.6100° N, 83.4500° W".
 *
 * @param position - [longitude, latitude] in degrees
 * @example formatPosition([-83.45, 35.61]) // '35.6100° N, 83.4500° W'
 */
export function formatPosition(position: Position): string {
  const [lon = 0, lat = 0] = position
  const latText = `${Math.abs(lat).toFixed(4)}° ${lat >= 0 ? 'N' : 'S'}`
  const lonText = `${Math.abs(lon).toFixed(4)}° ${lon >= 0 ? 'E' : 'W'}`
  return `${latText}, ${lonText}`
}

/** Formats km² with sensible precision: 0.0004 → '0.0004', 1234.5 → '1,234.5'. */
export function formatArea(km2: number): string {
  if (km2 === 0) return '0'
  if (km2 < 0.01) return km2.toPrecision(1)
  if (km2 < 10) return km2.toFixed(2)
  return km2.toLocaleString('en-US', { maximumFractionDigits: 1 })
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value)
}

/** Array depth of `coordinates` for each boundary type: a position is 1 deep, a ring 2, a polygon 3, a multipolygon 4. */
const COORDINATE_DEPTH: Record<(typeof BOUNDARY_TYPES)[number], number> = { Point: 1, Polygon: 3, MultiPolygon: 4 }

/**
 * True when lists inside `value` are nested deeper than `limit` (walked without recursion, so
 * a file nested thousands of levels deep cannot exhaust the stack here or in the later checks).
 */
function nestedDeeperThan(value: unknown, limit: number): boolean {
  const pending: Array<[unknown, number]> = [[value, 0]]
  while (pending.length > 0) {
    const [node, depth] = pending.pop()!
    if (!Array.isArray(node)) continue
    if (depth + 1 > limit) return true
    for (const child of node) if (Array.isArray(child)) pending.push([child, depth + 1])
  }
  return false
}

function* positionsOf(geometry: SubpopulationGeometry): Generator<Position> {
  if (geometry.type === 'Point') {
    yield geometry.coordinates
    return
  }
  const polygons = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates
  for (const polygon of polygons) for (const ring of polygon) for (const position of ring) yield position
}

function rangeProblem(geometry: SubpopulationGeometry): string | null {
  for (const position of positionsOf(geometry)) {
    const [lon = Number.NaN, lat = Number.NaN] = position
    if (!(lon >= -180 && lon <= 180)) return `A position has longitude ${lon}; longitudes run from -180 to 180 (check that longitude comes first, then latitude).`
    if (!(lat >= -90 && lat <= 90)) return `A position has latitude ${lat}; latitudes run from -90 to 90 (check that longitude comes first, then latitude).`
  }
  return null
}

function selfIntersectionProblem(geometry: Polygon | MultiPolygon): string | null {
  const crossings = kinks(geometry).features
  const first = crossings[0]
  if (!first) return null
  const more = crossings.length > 1 ? ` (and at ${crossings.length - 1} more ${crossings.length === 2 ? 'place' : 'places'})` : ''
  return `The boundary crosses itself near ${formatPosition(first.geometry.coordinates)}${more}. Redraw it so its edges do not cross.`
}

function areaProblem(geometry: Polygon | MultiPolygon): string | null {
  const km2 = area(geometry) / 1e6
  if (km2 < MIN_AREA_KM2) return `The boundary encloses ${formatArea(km2)} km²; a subpopulation boundary must cover at least ${MIN_AREA_KM2} km² (use a point for a single site).`
  if (km2 > MAX_AREA_KM2) return `The boundary encloses ${formatArea(km2)} km²; a subpopulation boundary may cover at most ${MAX_AREA_KM2.toLocaleString('en-US')} km².`
  return null
}

/**
 * Problems with a boundary, as sentences (empty when it is acceptable).
 *
 * @param geometry - any value: parsed JSON of a GeoJSON geometry
 * @returns problems in the order of the checks; structure problems stop the later checks
 * @example boundaryProblems({ type: 'Point', coordinates: [-83.5, 35.6] }) // []
 * @example boundaryProblems({ type: 'LineString', coordinates: [[0, 0], [1, 1]] })
 *   // ['A boundary must be a Polygon, MultiPolygon or Point, not a LineString.']
 */
export function boundaryProblems(geometry: unknown): string[] {
  if (!isRecord(geometry) || typeof geometry.type !== 'string') {
    return ['The boundary must be a GeoJSON geometry: a Polygon, MultiPolygon or Point.']
  }
  if (!(BOUNDARY_TYPES as readonly string[]).includes(geometry.type)) {
    return [`A boundary must be a Polygon, MultiPolygon or Point, not a ${geometry.type}.`]
  }
  const type = geometry.type as (typeof BOUNDARY_TYPES)[number]
  if (nestedDeeperThan(geometry.coordinates, COORDINATE_DEPTH[type])) {
    return [`The coordinates of a ${type} are lists nested at most ${COORDINATE_DEPTH[type]} deep; these are nested deeper.`]
  }
  const structure = getIssues(JSON.stringify(geometry)).map(issue => issue.message)
  if (structure.length) return [...new Set(structure)].map(message => `GeoJSON structure: ${message}`)

  const boundary = geometry as unknown as SubpopulationGeometry
  const outOfRange = rangeProblem(boundary)
  if (outOfRange) return [outOfRange]
  if (boundary.type === 'Point') return []

  // A crossing boundary has no meaningful area (its lobes cancel), so stop there.
  const crossing = selfIntersectionProblem(boundary)
  if (crossing) return [crossing]
  const size = areaProblem(boundary)
  return size ? [size] : []
}
