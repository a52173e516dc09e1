/**
 * Distances between subpopulations (shared/atlas/spherical.ts, shared/atlas/distances.ts).
 * Expected values: fixtures/distances.json — independent computation: haversine formula,
 * R = 6371.0088 km (IUGG mean radius), mpmath 40 digits; and turf's own point-to-line
 * distance as a second implementation of the point-to-arc measure.
 */
import { readFileSync } from 'node:fs'
import { distance, pointToLineDistance } from '@turf/turf'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { distanceTable, type DistanceInput } from '../../../shared/atlas/distances'
import { EARTH_RADIUS_KM, angleToArc, angleToPreparedArc, greatCircleKm, prepareArc, toUnitVector } from '../../../shared/atlas/spherical'

interface Fixture { source: string, cases: { from: [number, number], to: [number, number], about: string, km: number }[] }
const fixture = JSON.parse(readFileSync(new URL('./fixtures/distances.json', import.meta.url), 'utf8')) as Fixture

/** Relative k·eps for values from the independent computation; 1 µm floor for tiny distances (vector method). */
function close(actual: number, expected: number, k = 64): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(Math.max(k * Number.EPSILON * Math.abs(expected), 1e-9))
}

const square = (lon: number, lat: number, size: number) => ({ type: 'Polygon' as const, coordinates: [[[lon, lat], [lon + size, lat], [lon + size, lat + size], [lon, lat + size], [lon, lat]]] })

function input(id: number, name: string, geometry: DistanceInput['geometry'], centroid: [number, number] | null): DistanceInput {
  return { id, name, geometry, centroid: centroid ? { lon: centroid[0], lat: centroid[1] } : null }
}

describe('great-circle distance', () => {
  it(`matches the independent haversine values (${fixture.source})`, () => {
    expect(EARTH_RADIUS_KM).toBe(6371.0088)
    for (const item of fixture.cases) {
      close(greatCircleKm(item.from, item.to), item.km)
      // turf's haversine (used for centroid distances) agrees too.
      close(distance(item.from, item.to, { units: 'kilometers' }), item.km, 4096)
    }
  })

  it('the distance from a point to an arc: perpendicular inside the arc, nearer end outside it', () => {
    const equator = [toUnitVector([-1, 0]), toUnitVector([1, 0])] as const
    // (0°, 1°) lies 1° north of the equator arc: R·π/180 = 111.19508023353292 km (fixture case 1).
    close(angleToArc(toUnitVector([0, 1]), ...equator) * EARTH_RADIUS_KM, fixture.cases[0]!.km)
    // (2°, 0°) is beyond the end (1°, 0°): one degree along the equator again.
    close(angleToArc(toUnitVector([2, 0]), ...equator) * EARTH_RADIUS_KM, fixture.cases[0]!.km)
  })

  it('agrees with turf pointToLineDistance (geodesic) on random short arcs in the Appalachians', () => {
    fc.assert(fc.property(
      fc.tuple(fc.double({ min: -84, max: -82, noNaN: true }), fc.double({ min: 35, max: 36.5, noNaN: true })),
      fc.tuple(fc.double({ min: -84, max: -82, noNaN: true }), fc.double({ min: 35, max: 36.5, noNaN: true })),
      fc.tuple(fc.double({ min: -84, max: -82, noNaN: true }), fc.double({ min: 35, max: 36.5, noNaN: true })),
      (p, a, b) => {
        fc.pre(Math.abs(a[0] - b[0]) + Math.abs(a[1] - b[1]) > 1e-6)
        const ours = angleToArc(toUnitVector(p), toUnitVector(a), toUnitVector(b)) * EARTH_RADIUS_KM
        const theirs = pointToLineDistance(p, { type: 'LineString', coordinates: [a, b] }, { units: 'kilometers', method: 'geodesic' })
        // turf finds the nearest point by its own spherical construction; 1 m or 1e-6 relative.
        expect(Math.abs(ours - theirs)).toBeLessThanOrEqual(Math.max(1e-3, 1e-6 * theirs))
      },
    ), { numRuns: 300, seed: 20250601 })
  })
})

describe('prepared arcs (the fast path of the distance table)', () => {
  it('give the same angle as the direct construction, anywhere on the globe (edges up to 10° long)', () => {
    // Boundary edges are short; an arc between (nearly) antipodal ends has no defined plane.
    const position = fc.tuple(fc.double({ min: -180, max: 180, noNaN: true }), fc.double({ min: -80, max: 80, noNaN: true }))
    const step = fc.tuple(fc.double({ min: -10, max: 10, noNaN: true }), fc.double({ min: -10, max: 10, noNaN: true }))
    fc.assert(fc.property(position, position, step, (p, a, offset) => {
      const b = [a[0] + offset[0], a[1] + offset[1]]
      const [pv, av, bv] = [toUnitVector(p), toUnitVector(a), toUnitVector(b)]
      const direct = angleToArc(pv, av, bv)
      const prepared = angleToPreparedArc(pv, prepareArc(av, bv))
      expect(Math.abs(prepared - direct)).toBeLessThanOrEqual(1e-9)
    }), { numRuns: 2000, seed: 7 })
  })
})

describe('distance table', () => {
  const west = input(1, 'West', square(0, 0, 1), [0.5, 0.5])
  const east = input(2, 'East', square(2, 0, 1), [2.5, 0.5])
  const touching = input(3, 'Touching', square(1, 0, 0.5), [1.25, 0.25])
  const site = input(4, 'A site', { type: 'Point', coordinates: [0.5, 0.5] }, [0.5, 0.5])
  const unplaced = input(5, 'Unplaced', null, null)

  it('edge distance between two squares one degree apart is the great circle between their nearest corners', () => {
    // Hand check: the nearest points are the north-east corner (1°, 1°) of West and the north-west
    // corner (2°, 1°) of East (the perpendiculars from them fall outside the other square's side),
    // 111.17814425440773 km by the independent haversine (fixture case 2).
    const table = distanceTable([west, east])
    expect(table.items.map(item => item.name)).toEqual(['East', 'West'])
    close(table.edgeKm?.[0]?.[1] ?? Number.NaN, Math.round(fixture.cases[1]!.km * 1000) / 1000)
    expect(table.edgeKm?.[1]?.[0]).toBe(table.edgeKm?.[0]?.[1])
    // Centroids (0.5°, 0.5°) and (2.5°, 0.5°): two degrees of longitude at latitude 0.5°.
    expect(table.centroidKm?.[0]?.[1]).toBeCloseTo(222.382, 3)
    expect(table.centroidKm?.[0]?.[0]).toBe(0)
  })

  it('is 0 for boundaries that touch, and for a point inside a boundary', () => {
    const table = distanceTable([west, touching, site])
    const index = (name: string) => table.items.findIndex(item => item.name === name)
    expect(table.edgeKm?.[index('West')]?.[index('Touching')]).toBe(0)
    expect(table.edgeKm?.[index('West')]?.[index('A site')]).toBe(0)
    expect(table.edgeKm?.[index('Touching')]?.[index('A site')]).toBeGreaterThan(50)
  })

  it('finds nearest neighbours and lists records without a boundary apart', () => {
    const table = distanceTable([west, east, touching, unplaced])
    expect(table.withoutGeometry).toEqual([{ id: 5, name: 'Unplaced' }])
    const nearest = new Map(table.nearest.map(n => [n.id, n.neighbourId]))
    expect(nearest.get(1)).toBe(3)
    expect(nearest.get(3)).toBe(1)
    expect(nearest.get(2)).toBe(3)
    expect(table.method).toMatch(/6371\.0088 km/)
  })

  it('above the matrix limit, gives the same nearest neighbours without the matrices', () => {
    const many: DistanceInput[] = []
    for (let i = 0; i < 40; i += 1) {
      const lon = -84 + (i % 8) * 0.3 + (i % 3) * 0.01
      const lat = 35 + Math.floor(i / 8) * 0.25
      many.push(input(i + 1, `S${String(i).padStart(2, '0')}`, square(lon, lat, 0.1 + (i % 4) * 0.02), [lon + 0.05, lat + 0.05]))
    }
    const full = distanceTable(many)
    const pruned = distanceTable(many, { matrixLimit: 10 })
    expect(pruned.centroidKm).toBeNull()
    expect(pruned.edgeKm).toBeNull()
    const byId = (rows: typeof full.nearest) => [...rows].sort((a, b) => a.id - b.id)
    expect(byId(pruned.nearest)).toEqual(byId(full.nearest))
  })
})
