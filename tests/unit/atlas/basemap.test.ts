/**
 * The offline basemap (shared/atlas/basemap.ts → public/basemap/*.geojson).
 *
 * The files are made from node_modules/world-atlas at development time. To (re)write them:
 *   UPDATE_BASEMAP=1 npx vitest run --project unit tests/unit/atlas/basemap.test.ts
 * Without UPDATE_BASEMAP the test checks that the committed files are exactly what the
 * converter makes from the installed world-atlas, and that no line jumps across the map.
 */
import { existsSync, readFileSync, writeFileSync } from 'node:fs'
import type { Feature, MultiLineString, MultiPolygon, Position } from 'geojson'
import type { Topology } from 'topojson-specification'
import { describe, expect, it } from 'vitest'
import { bordersFeature, landFeature, roundTo, unwrapLine, unwrapRing } from '../../../shared/atlas/basemap'

const root = new URL('../../../', import.meta.url)
const files = {
  land: new URL('public/basemap/land-50m.geojson', root),
  borders: new URL('public/basemap/borders-50m.geojson', root),
}

function largestJump(lines: readonly Position[][]): number {
  let largest = 0
  for (const line of lines) {
    for (let i = 1; i < line.length; i += 1) largest = Math.max(largest, Math.abs((line[i]?.[0] ?? 0) - (line[i - 1]?.[0] ?? 0)))
  }
  return largest
}

describe('unwrapping at ±180°', () => {
  it('shifts positions past the antimeridian instead of jumping back', () => {
    expect(unwrapLine([[179, 10], [-179, 11], [-178, 12]])).toEqual({ line: [[179, 10], [181, 11], [182, 12]], shift: 360 })
    expect(unwrapLine([[-179, 10], [179, 11]]).line).toEqual([[-179, 10], [-181, 11]])
    expect(unwrapLine([[10, 0], [20, 0]])).toEqual({ line: [[10, 0], [20, 0]], shift: 0 })
  })

  it('keeps an island ring across the antimeridian closed and compact', () => {
    const ring = unwrapRing([[179, -16], [-179, -16], [-179, -17], [179, -17], [179, -16]])
    expect(ring).toEqual([[179, -16], [181, -16], [181, -17], [179, -17], [179, -16]])
  })

  it('closes a ring that circles the south pole along the pole instead of across the map', () => {
    // Once around the pole eastwards, then straight back to the start (a 360° jump before unwrapping).
    const ring = unwrapRing([[-170, -70], [-80, -72], [10, -71], [100, -69], [170, -70], [-170, -70]])
    expect(largestJump([ring])).toBeLessThanOrEqual(90)
    expect(ring[5]).toEqual([190, -70])
    expect(ring.slice(6, -1).every(p => p[1] === -90)).toBe(true)
    expect(ring.at(-1)).toEqual([-170, -70])
    expect(roundTo(-83.456789, 3)).toBe(-83.457)
  })
})

describe('committed basemap files', () => {
  const topology = JSON.parse(readFileSync(new URL('node_modules/world-atlas/countries-50m.json', root), 'utf8')) as Topology
  const land = landFeature(topology)
  const borders = bordersFeature(topology)

  if (process.env.UPDATE_BASEMAP) {
    writeFileSync(files.land, `${JSON.stringify(land)}\n`)
    writeFileSync(files.borders, `${JSON.stringify(borders)}\n`)
  }

  it('land and borders have no segment that jumps across the map', () => {
    expect(largestJump(land.geometry.coordinates.flat())).toBeLessThan(180)
    expect(largestJump(borders.geometry.coordinates)).toBeLessThan(180)
    expect(land.geometry.coordinates.length).toBeGreaterThan(1000)
  })

  it('the files in public/basemap are what the converter makes from world-atlas', () => {
    expect(existsSync(files.land), 'run with UPDATE_BASEMAP=1 once').toBe(true)
    const committedLand = JSON.parse(readFileSync(files.land, 'utf8')) as Feature<MultiPolygon>
    const committedBorders = JSON.parse(readFileSync(files.borders, 'utf8')) as Feature<MultiLineString>
    expect(committedLand).toEqual(land)
    expect(committedBorders).toEqual(borders)
    expect(committedLand.properties?.source).toMatch(/Natural Earth \(public domain\)/)
  })

  it('covers the southern Appalachians with land', () => {
    // A point near the demo subpopulations (-83.5, 35.6) lies inside the largest land polygon's bbox.
    const northAmerica = land.geometry.coordinates.find(polygon => polygon[0]?.some(([lon = 0, lat = 0]) => lon < -83 && lon > -84 && lat > 29 && lat < 31))
    expect(northAmerica).toBeDefined()
  })
})
