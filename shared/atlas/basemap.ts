/**
 * Turns Natural Earth's TopoJSON (the world-atlas package) into the GeoJSON files of the
 * offline basemap in public/basemap/ (see its README): land as one MultiPolygon, country
 * borders as one MultiLineString, coordinates rounded, and rings that cross the ±180°
 * meridian unwrapped so Leaflet does not draw them as bands across the whole map.
 * Run at development time only (tests/unit/atlas/basemap.test.ts writes and checks the files).
 */
import { merge, mesh } from 'topojson-client'
import type { Feature, MultiLineString, MultiPolygon, Position } from 'geojson'
import type { GeometryCollection, Topology } from 'topojson-specification'

/**
 * Rounds a coordinate to `digits` decimals.
 *
 * @example roundTo(-83.456789, 3) // -83.457
 */
export function roundTo(value: number, digits: number): number {
  const factor = 10 ** digits
  return Math.round(value * factor) / factor
}

/**
 * Removes the ±360° jumps of a line or ring that crosses the antimeridian: each position is
 * shifted by a multiple of 360° so that consecutive longitudes differ by at most 180°. The
 * result may reach past ±180°, which Leaflet draws on the neighbouring copy of the world.
 *
 * @param line - positions [lon, lat] in degrees
 * @returns a new list, and the total shift of the last position (0 unless the line circles a pole)
 * @example unwrapLine([[179, 10], [-179, 11]]).line // [[179, 10], [181, 11]]
 */
export function unwrapLine(line: readonly Position[]): { line: Position[], shift: number } {
  const result: Position[] = []
  let shift = 0
  let previous: number | null = null
  for (const position of line) {
    const [lon = 0, lat = 0] = position
    if (previous !== null) {
      const step = lon + shift - previous
      if (step > 180) shift -= 360
      else if (step < -180) shift += 360
    }
    previous = lon + shift
    result.push([previous, lat])
  }
  return { line: result, shift }
}

/**
 * Unwraps a polygon ring. A ring that goes once around a pole (its end is 360° away from its
 * start once unwrapped, as Antarctica's does) is closed along the pole's latitude instead of
 * by a band across the map.
 *
 * @param ring - closed ring [lon, lat] in degrees
 * @returns a closed ring without ±360° jumps
 */
export function unwrapRing(ring: readonly Position[]): Position[] {
  const { line, shift } = unwrapLine(ring)
  if (shift === 0) return line
  const first = line[0] ?? [0, 0]
  const last = line[line.length - 1] ?? [0, 0]
  const meanLatitude = line.reduce((sum, position) => sum + (position[1] ?? 0), 0) / Math.max(1, line.length)
  const pole = meanLatitude < 0 ? -90 : 90
  // Along the pole in steps of at most 90°, so no segment spans half the world.
  const from = last[0] ?? 0
  const to = first[0] ?? 0
  const steps = Math.max(1, Math.ceil(Math.abs(to - from) / 90))
  const alongPole: Position[] = []
  for (let k = 0; k <= steps; k += 1) alongPole.push([from + ((to - from) * k) / steps, pole])
  return [...line, ...alongPole, first]
}

function roundLine(line: readonly Position[], digits: number): Position[] {
  const rounded: Position[] = []
  for (const [lon = 0, lat = 0] of line) {
    const next: Position = [roundTo(lon, digits), roundTo(lat, digits)]
    const previous = rounded[rounded.length - 1]
    // Rounding can make neighbours equal; keep one of them.
    if (!previous || previous[0] !== next[0] || previous[1] !== next[1]) rounded.push(next)
  }
  return rounded
}

/** Source line written into every basemap file. */
export const BASEMAP_SOURCE = 'Natural Earth (public domain), 1:50m, via world-atlas 2.0.2 (ISC); converted by shared/atlas/basemap.ts'

/**
 * Land (merged countries) of a world-atlas countries topology as one MultiPolygon feature.
 *
 * @param topology - world-atlas `countries-50m.json`
 * @param digits - decimals kept (3 ≈ 110 m)
 */
export function landFeature(topology: Topology, digits = 3): Feature<MultiPolygon> {
  const countries = topology.objects.countries as GeometryCollection
  const land = merge(topology, countries.geometries as Parameters<typeof merge>[1])
  const coordinates = land.coordinates
    .map(polygon => polygon.map(ring => roundLine(unwrapRing(ring), digits)).filter(ring => ring.length >= 4))
    .filter(polygon => polygon.length > 0)
  return { type: 'Feature', properties: { source: BASEMAP_SOURCE, layer: 'land' }, geometry: { type: 'MultiPolygon', coordinates } }
}

/**
 * Borders between countries (shared arcs only, no coastlines) as one MultiLineString feature.
 *
 * @param topology - world-atlas `countries-50m.json`
 * @param digits - decimals kept
 */
export function bordersFeature(topology: Topology, digits = 3): Feature<MultiLineString> {
  const countries = topology.objects.countries as GeometryCollection
  const borders = mesh(topology, countries, (a, b) => a !== b)
  const coordinates = borders.coordinates
    .map(line => roundLine(unwrapLine(line).line, digits))
    .filter(line => line.length >= 2)
  return { type: 'Feature', properties: { source: BASEMAP_SOURCE, layer: 'borders' }, geometry: { type: 'MultiLineString', coordinates } }
}
