/**
 * Boundary checks shared by the drawing tools, the import and the routes
 * (shared/atlas/geometry-check.ts): structure and positions, type, range, self-intersection
 * and plausible area. Areas of the test squares: turf's spherical area, cross-checked by the
 * planar estimate (side in km)² on a small square near the equator.
 */
import { describe, expect, it } from 'vitest'
import { MAX_AREA_KM2, MIN_AREA_KM2, boundaryProblems, formatPosition } from '../../../shared/atlas/geometry-check'

/** A square of `sizeDegrees` with its south-west corner at (lon, lat). */
function square(lon: number, lat: number, sizeDegrees: number) {
  return { type: 'Polygon', coordinates: [[[lon, lat], [lon + sizeDegrees, lat], [lon + sizeDegrees, lat + sizeDegrees], [lon, lat + sizeDegrees], [lon, lat]]] }
}

describe('boundaryProblems', () => {
  it('accepts a plain polygon, a multipolygon and a point', () => {
    expect(boundaryProblems(square(-83.5, 35.5, 0.1))).toEqual([])
    expect(boundaryProblems({ type: 'MultiPolygon', coordinates: [square(-83.5, 35.5, 0.1).coordinates, square(-83.2, 35.5, 0.1).coordinates] })).toEqual([])
    expect(boundaryProblems({ type: 'Point', coordinates: [-83.5, 35.6] })).toEqual([])
  })

  it('refuses what is not a geometry, or the wrong type', () => {
    expect(boundaryProblems(null)).toEqual(['The boundary must be a GeoJSON geometry: a Polygon, MultiPolygon or Point.'])
    expect(boundaryProblems('Polygon')).toHaveLength(1)
    expect(boundaryProblems({ type: 'LineString', coordinates: [[0, 0], [1, 1]] })).toEqual(['A boundary must be a Polygon, MultiPolygon or Point, not a LineString.'])
  })

  it('reports structure problems found by check-geojson (open ring, too few positions, bad position)', () => {
    const open = boundaryProblems({ type: 'Polygon', coordinates: [[[0, 0], [1, 0], [1, 1], [0, 1]]] })
    expect(open.join(' ')).toMatch(/First and last positions .* should be the same/)
    const short = boundaryProblems({ type: 'Polygon', coordinates: [[[0, 0], [1, 0], [0, 0]]] })
    expect(short.join(' ')).toMatch(/four or more positions/)
    const text = boundaryProblems({ type: 'Point', coordinates: ['-83', 35] })
    expect(text[0]).toMatch(/^GeoJSON structure: /)
  })

  it('refuses coordinates nested deeper than the type needs, even thousands deep, without exhausting the stack', () => {
    const deep = JSON.parse(`${'['.repeat(20_000)}${']'.repeat(20_000)}`) as unknown
    expect(boundaryProblems({ type: 'Polygon', coordinates: deep })).toEqual(['The coordinates of a Polygon are lists nested at most 3 deep; these are nested deeper.'])
    expect(boundaryProblems({ type: 'MultiPolygon', coordinates: deep })).toHaveLength(1)
    expect(boundaryProblems({ type: 'Point', coordinates: [[-83, 35]] })).toEqual(['The coordinates of a Point are lists nested at most 1 deep; these are nested deeper.'])
    expect(boundaryProblems({ type: 'Polygon', coordinates: [[[[-83, 35]]]] })[0]).toMatch(/nested at most 3 deep/)
  })

  it('refuses positions off the globe and hints at swapped coordinates', () => {
    expect(boundaryProblems({ type: 'Point', coordinates: [35.6, -183.5] })[0]).toMatch(/latitude -183\.5; latitudes run from -90 to 90 \(check that longitude comes first/)
    expect(boundaryProblems({ type: 'Point', coordinates: [200, 10] })[0]).toMatch(/longitude 200/)
  })

  it('refuses a self-intersecting polygon and says where it crosses', () => {
    const bowTie = { type: 'Polygon', coordinates: [[[-83, 35], [-82.9, 35.1], [-82.9, 35], [-83, 35.1], [-83, 35]]] }
    // The edges (-83,35)–(-82.9,35.1) and (-82.9,35)–(-83,35.1) cross at (-82.95, 35.05) in the plane of turf's test.
    expect(boundaryProblems(bowTie)).toEqual(['The boundary crosses itself near 35.0500° N, 82.9500° W. Redraw it so its edges do not cross.'])
  })

  it('refuses implausible areas (below 0.001 km², above 100,000 km²)', () => {
    expect(MIN_AREA_KM2).toBe(0.001)
    expect(MAX_AREA_KM2).toBe(100_000)
    // 0.0001° ≈ 11 m at the equator: about 0.00012 km², below the minimum.
    expect(boundaryProblems(square(0, 0, 0.0001))[0]).toMatch(/^The boundary encloses 0\.0001 km²; a subpopulation boundary must cover at least 0\.001 km²/)
    // 0.0003° ≈ 33 m: about 0.0011 km², just above it.
    expect(boundaryProblems(square(0, 0, 0.0003))).toEqual([])
    // 4° × 4° near the equator ≈ (445 km)² ≈ 198,000 km², above the maximum.
    expect(boundaryProblems(square(0, 0, 4))[0]).toMatch(/encloses 19\d,\d{3}(\.\d)? km²; .* at most 100,000 km²/)
  })
})

describe('formatPosition', () => {
  it('writes latitude first with hemispheres', () => {
    expect(formatPosition([-83.45, 35.61])).toBe('35.6100° N, 83.4500° W')
    expect(formatPosition([151.2, -33.9])).toBe('33.9000° S, 151.2000° E')
  })
})
