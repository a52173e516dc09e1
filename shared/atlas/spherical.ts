/**
 * Great-circle geometry on a sphere for distances between subpopulation boundaries.
 *
 * Positions become unit vectors in 3-D; the angle between two unit vectors u, v is
 * atan2(|u × v|, u · v), which stays accurate for tiny angles (where acos loses digits), and
 * a distance is that angle times the earth's mean radius R = 6371.0088 km (IUGG mean radius,
 * the value turf uses). The distance from a point to a great-circle arc is the distance to
 * the arc's great circle when the foot of the perpendicular lies on the arc, else the distance
 * to the nearer end. Assumes a spherical earth (error against the ellipsoid up to about 0.5%) and
 * arcs shorter than 180° (an arc between antipodal ends has no defined plane; boundary edges
 * are short).
 *
 * Written here rather than through turf's `pointToLineDistance` because a distance matrix
 * makes millions of point-to-arc measurements and turf allocates a feature per segment
 * (about 5 ms per pair of demo boundaries against well under 0.1 ms here); the unit tests
 * compare the two.
 */
import type { Position } from 'geojson'

/** Mean earth radius in km (IUGG; turf's `earthRadius` / 1000). */
export const EARTH_RADIUS_KM = 6371.0088

/** A unit vector (x, y, z). */
export type UnitVector = readonly [number, number, number]

const DEGREE = Math.PI / 180

/**
 * The unit vector of a [longitude, latitude] position in degrees.
 *
 * @example toUnitVector([0, 0]) // [1, 0, 0]
 */
export function toUnitVector(position: Position): UnitVector {
  const [lon = 0, lat = 0] = position
  const phi = lat * DEGREE
  const lambda = lon * DEGREE
  const cosPhi = Math.cos(phi)
  return [cosPhi * Math.cos(lambda), cosPhi * Math.sin(lambda), Math.sin(phi)]
}

function cross(u: UnitVector, v: UnitVector): [number, number, number] {
  return [u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]]
}

function dot(u: readonly number[], v: readonly number[]): number {
  return (u[0] ?? 0) * (v[0] ?? 0) + (u[1] ?? 0) * (v[1] ?? 0) + (u[2] ?? 0) * (v[2] ?? 0)
}

function norm(u: readonly number[]): number {
  return Math.sqrt(dot(u, u))
}

/**
 * Angle between two unit vectors, radians, in [0, π]: atan2(|u × v|, u · v).
 *
 * @example angleBetween([1, 0, 0], [0, 1, 0]) // 1.5707963267948966 (π/2)
 */
export function angleBetween(u: UnitVector, v: UnitVector): number {
  return Math.atan2(norm(cross(u, v)), dot(u, v))
}

/**
 * Angular distance from point p to the great-circle arc from a to b (the shorter arc), radians.
 *
 * @param p - the point, unit vector
 * @param a - start of the arc, unit vector
 * @param b - end of the arc, unit vector
 * @returns angle in [0, π]
 * @example angleToArc(toUnitVector([0, 1]), toUnitVector([-1, 0]), toUnitVector([1, 0])) // 0.017453292519943295 (1°)
 */
export function angleToArc(p: UnitVector, a: UnitVector, b: UnitVector): number {
  const normal = cross(a, b)
  const length = norm(normal)
  if (length < 1e-15) return angleBetween(p, a)
  const n: UnitVector = [normal[0] / length, normal[1] / length, normal[2] / length]
  const offPlane = dot(p, n)
  // Foot of the perpendicular from p on the great circle through a and b.
  const foot: [number, number, number] = [p[0] - offPlane * n[0], p[1] - offPlane * n[1], p[2] - offPlane * n[2]]
  const footLength = norm(foot)
  if (footLength > 1e-15) {
    // The foot lies on the arc when it is "after" a and "before" b around the normal.
    const afterA = dot(cross(a, foot), n) >= 0
    const beforeB = dot(cross(foot, b), n) >= 0
    if (afterA && beforeB) return Math.atan2(Math.abs(offPlane), footLength)
  }
  return Math.min(angleBetween(p, a), angleBetween(p, b))
}

/**
 * Great-circle distance between two positions, km (R = 6371.0088 km).
 *
 * @example greatCircleKm([-83.5, 35.6], [-83.5, 35.6]) // 0
 */
export function greatCircleKm(from: Position, to: Position): number {
  return angleBetween(toUnitVector(from), toUnitVector(to)) * EARTH_RADIUS_KM
}

/**
 * A great-circle arc prepared for many distance queries: its ends, the unit normal n̂ of its
 * plane and the two "fence" vectors n̂ × a and b × n̂. A point p's foot on the great circle lies
 * on the arc exactly when p · (n̂ × a) ≥ 0 and p · (b × n̂) ≥ 0, and then the angle to the arc is
 * asin |p · n̂|; otherwise it is the angle to the nearer end. Same result as angleToArc without
 * allocating per query (the unit tests compare the two).
 */
export interface PreparedArc {
  a: UnitVector
  b: UnitVector
  /** Unit normal, or null for a degenerate arc (a = b). */
  normal: UnitVector | null
  fenceA: UnitVector
  fenceB: UnitVector
}

/** Prepares the arc from a to b (unit vectors). */
export function prepareArc(a: UnitVector, b: UnitVector): PreparedArc {
  const normal = cross(a, b)
  const length = norm(normal)
  if (length < 1e-15) return { a, b, normal: null, fenceA: [0, 0, 0], fenceB: [0, 0, 0] }
  const n: UnitVector = [normal[0] / length, normal[1] / length, normal[2] / length]
  return { a, b, normal: n, fenceA: cross(n, a), fenceB: cross(b, n) }
}

/** Angle between unit vectors without allocating: atan2(|u × v|, u · v). */
function angleBetweenScalar(u: UnitVector, v: UnitVector): number {
  const x = u[1] * v[2] - u[2] * v[1]
  const y = u[2] * v[0] - u[0] * v[2]
  const z = u[0] * v[1] - u[1] * v[0]
  return Math.atan2(Math.sqrt(x * x + y * y + z * z), u[0] * v[0] + u[1] * v[1] + u[2] * v[2])
}

/**
 * Angular distance (radians) from unit vector p to a prepared arc.
 *
 * @example angleToPreparedArc(toUnitVector([0, 1]), prepareArc(toUnitVector([-1, 0]), toUnitVector([1, 0]))) // 0.017453292519943295 (1°)
 */
export function angleToPreparedArc(p: UnitVector, arc: PreparedArc): number {
  const n = arc.normal
  if (n) {
    const onA = p[0] * arc.fenceA[0] + p[1] * arc.fenceA[1] + p[2] * arc.fenceA[2]
    const onB = p[0] * arc.fenceB[0] + p[1] * arc.fenceB[1] + p[2] * arc.fenceB[2]
    if (onA >= 0 && onB >= 0) {
      const offPlane = Math.abs(p[0] * n[0] + p[1] * n[1] + p[2] * n[2])
      return Math.atan2(offPlane, Math.sqrt(Math.max(0, 1 - offPlane * offPlane)))
    }
  }
  return Math.min(angleBetweenScalar(p, arc.a), angleBetweenScalar(p, arc.b))
}
