/**
 * Distances between a species' subpopulations: great-circle distance between centroids (turf
 * `distance`, haversine with R = 6371.0088 km) and between the nearest points of their
 * boundaries (0 when they touch or overlap — turf `booleanIntersects` — else the least
 * point-to-arc distance between one boundary's vertices and the other's edges, see
 * ./spherical.ts), and each one's nearest neighbour by boundary distance.
 *
 * Cost: the matrix measures every pair, O(n² · v²) for n boundaries of v vertices, so it is
 * left out above `matrixLimit` subpopulations; nearest neighbours are then found with a lower
 * bound (centroid distance minus both boundaries' radii) that skips most pairs.
 */
import { booleanIntersects, distance } from '@turf/turf'
import type { Position } from 'geojson'
import { EARTH_RADIUS_KM, angleBetween, angleToPreparedArc, prepareArc, toUnitVector, type PreparedArc, type UnitVector } from './spherical'
import type { DistanceMatrixResponse, NearestNeighbour, SubpopulationGeometry } from './types'

/** A subpopulation as the distance table needs it. */
export interface DistanceInput {
  id: number
  name: string
  geometry: SubpopulationGeometry | null
  centroid: { lon: number, lat: number } | null
}

/** Default largest number of subpopulations for which the full matrix is computed. */
export const DISTANCE_MATRIX_LIMIT = 300

/** Words for the method, shown under the table. */
export const DISTANCE_METHOD = 'Great-circle distances on a sphere of radius 6371.0088 km: between centroids (centre of mass), '
  + 'and between the nearest points of the boundaries (0 when they touch or overlap).'

interface Prepared {
  input: DistanceInput & { geometry: SubpopulationGeometry, centroid: { lon: number, lat: number } }
  centroid: Position
  /** Centroid as a unit vector (for the pruning bound). */
  centre: UnitVector
  vertices: UnitVector[]
  /** Edges, prepared for distance queries (empty for a point). */
  arcs: PreparedArc[]
  /** [west, south, east, north] in degrees. */
  bbox: [number, number, number, number]
  /** Largest distance from the centroid to a vertex, km (0 for a point). */
  radiusKm: number
}

function ringsOf(geometry: SubpopulationGeometry): Position[][] {
  if (geometry.type === 'Point') return [[geometry.coordinates]]
  if (geometry.type === 'Polygon') return geometry.coordinates
  return geometry.coordinates.flat()
}

function prepare(input: Prepared['input']): Prepared {
  const rings = ringsOf(input.geometry)
  const vertices: UnitVector[] = []
  const arcs: PreparedArc[] = []
  const bbox: [number, number, number, number] = [Infinity, Infinity, -Infinity, -Infinity]
  const centroid: Position = [input.centroid.lon, input.centroid.lat]
  const centre = toUnitVector(centroid)
  let radius = 0 // radians
  for (const ring of rings) {
    let previous: UnitVector | null = null
    for (const position of ring) {
      const [lon = 0, lat = 0] = position
      bbox[0] = Math.min(bbox[0], lon)
      bbox[1] = Math.min(bbox[1], lat)
      bbox[2] = Math.max(bbox[2], lon)
      bbox[3] = Math.max(bbox[3], lat)
      const vector = toUnitVector(position)
      vertices.push(vector)
      radius = Math.max(radius, angleBetween(vector, centre))
      if (previous && input.geometry.type !== 'Point') arcs.push(prepareArc(previous, vector))
      previous = vector
    }
  }
  return { input, centroid, centre, vertices, arcs, bbox, radiusKm: radius * EARTH_RADIUS_KM }
}

function bboxesOverlap(a: Prepared['bbox'], b: Prepared['bbox']): boolean {
  return a[0] <= b[2] && b[0] <= a[2] && a[1] <= b[3] && b[1] <= a[3]
}

function leastAngle(points: readonly UnitVector[], arcs: readonly PreparedArc[], best: number): number {
  let least = best
  for (const point of points) {
    for (const arc of arcs) {
      const angle = angleToPreparedArc(point, arc)
      if (angle < least) least = angle
    }
  }
  return least
}

/**
 * Great-circle distance between the nearest points of two boundaries, km; 0 when they touch,
 * overlap or one holds the other.
 */
function edgeDistanceKm(a: Prepared, b: Prepared): number {
  if (bboxesOverlap(a.bbox, b.bbox) && booleanIntersects(a.input.geometry, b.input.geometry)) return 0
  if (a.arcs.length === 0 && b.arcs.length === 0) return centroidDistanceKm(a, b)
  let least = Infinity
  if (b.arcs.length) least = leastAngle(a.vertices, b.arcs, least)
  if (a.arcs.length) least = leastAngle(b.vertices, a.arcs, least)
  return least * EARTH_RADIUS_KM
}

function centroidDistanceKm(a: Prepared, b: Prepared): number {
  return distance(a.centroid, b.centroid, { units: 'kilometers' })
}

/** Rounds km to metres (3 decimals), so answers do not carry floating-point noise. */
function metres(km: number): number {
  return Math.round(km * 1000) / 1000
}

function nearestFromMatrix(prepared: readonly Prepared[], centroidKm: number[][], edgeKm: number[][]): NearestNeighbour[] {
  return prepared.map((item, i) => {
    let best = -1
    for (let j = 0; j < prepared.length; j += 1) {
      if (j === i) continue
      const candidate = edgeKm[i]?.[j] ?? Infinity
      const current = best < 0 ? Infinity : edgeKm[i]?.[best] ?? Infinity
      if (candidate < current || (candidate === current && (centroidKm[i]?.[j] ?? Infinity) < (centroidKm[i]?.[best] ?? Infinity))) best = j
    }
    const neighbour = prepared[best]
    return {
      id: item.input.id,
      neighbourId: neighbour ? neighbour.input.id : null,
      centroidKm: neighbour ? centroidKm[i]?.[best] ?? null : null,
      edgeKm: neighbour ? edgeKm[i]?.[best] ?? null : null,
    }
  })
}

function nearestByPruning(prepared: readonly Prepared[]): NearestNeighbour[] {
  // Same order as nearestFromMatrix: edge, then centroid distance (both in metres), then name order.
  const better = (a: { edge: number, centroid: number, index: number }, b: { edge: number, centroid: number, index: number }) =>
    a.edge !== b.edge ? a.edge < b.edge : a.centroid !== b.centroid ? a.centroid < b.centroid : a.index < b.index
  return prepared.map((item, self) => {
    // Lower bound of the gap from the centres (cheap vector angle), loosened by a metre for rounding.
    const candidates: { other: Prepared, index: number, lowerBound: number }[] = []
    prepared.forEach((other, index) => {
      if (index === self) return
      const centres = angleBetween(item.centre, other.centre) * EARTH_RADIUS_KM
      candidates.push({ other, index, lowerBound: Math.max(0, centres - item.radiusKm - other.radiusKm - 0.001) })
    })
    candidates.sort((x, y) => x.lowerBound - y.lowerBound)
    let best: { other: Prepared, index: number, centroid: number, edge: number } | null = null
    for (const candidate of candidates) {
      if (best && candidate.lowerBound > best.edge) break
      const found = { ...candidate, centroid: metres(centroidDistanceKm(item, candidate.other)), edge: metres(edgeDistanceKm(item, candidate.other)) }
      if (!best || better(found, best)) best = found
    }
    return {
      id: item.input.id,
      neighbourId: best ? best.other.input.id : null,
      centroidKm: best ? best.centroid : null,
      edgeKm: best ? best.edge : null,
    }
  })
}

/**
 * The distance table of a species' subpopulations.
 *
 * @param items - subpopulations; those without geometry or centroid are listed apart
 * @param options.matrixLimit - most subpopulations for which the full matrix is computed
 * @returns items in name order, the two matrices (km, rounded to metres; null above the
 *   limit), each one's nearest neighbour by boundary distance, and the method in words
 */
export function distanceTable(items: readonly DistanceInput[], options: { matrixLimit?: number } = {}): DistanceMatrixResponse {
  const matrixLimit = options.matrixLimit ?? DISTANCE_MATRIX_LIMIT
  const located = items
    .filter((item): item is Prepared['input'] => item.geometry !== null && item.centroid !== null)
    .sort((a, b) => a.name.localeCompare(b.name, 'en') || a.id - b.id)
  const withoutGeometry = items
    .filter(item => item.geometry === null || item.centroid === null)
    .map(item => ({ id: item.id, name: item.name }))
  const prepared = located.map(prepare)

  if (prepared.length > matrixLimit) {
    return {
      items: located.map(item => ({ id: item.id, name: item.name })),
      centroidKm: null,
      edgeKm: null,
      nearest: nearestByPruning(prepared),
      withoutGeometry,
      method: DISTANCE_METHOD,
    }
  }

  // Lower triangle first, then mirrored: each pair is measured once.
  const centroidKm = prepared.map((a, i) => prepared.slice(0, i).map(b => metres(centroidDistanceKm(a, b))))
  const edgeKm = prepared.map((a, i) => prepared.slice(0, i).map(b => metres(edgeDistanceKm(a, b))))
  const mirror = (lower: number[][]) => lower.map((_, i) => prepared.map((__, j) => (j < i ? lower[i]?.[j] : j > i ? lower[j]?.[i] : 0) ?? 0))
  const fullCentroidKm = mirror(centroidKm)
  const fullEdgeKm = mirror(edgeKm)
  return {
    items: located.map(item => ({ id: item.id, name: item.name })),
    centroidKm: fullCentroidKm,
    edgeKm: fullEdgeKm,
    nearest: nearestFromMatrix(prepared, fullCentroidKm, fullEdgeKm),
    withoutGeometry,
    method: DISTANCE_METHOD,
  }
}
