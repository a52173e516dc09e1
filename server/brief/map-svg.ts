/**
 * The brief's map figure as an SVG string, drawn from the stored GeoJSON: the recipient and its
 * source subpopulations (other subpopulations of the species faintly, for context), an arrow
 * from each source to the recipient, a scale bar in km and a north arrow.
 *
 * Projection: equirectangular, x = (λ − λ₀)·cos φ₀, y = φ, with φ₀ the latitude at the centre
 * of the view; distances are true along the centre latitude and off by less than 1% within
 * ±0.8° of it, which covers the areas a brief shows (a few tens of km). Longitudes are unwrapped
 * around λ₀ so a view across ±180° stays in one piece. One projected unit is one degree of
 * latitude, 111.32 km (mean meridian degree).
 *
 * Pure (no I/O); the only input is the subpopulations.
 */
import type { Geometry, Position } from 'geojson'
import type { BriefSubpopulation } from './types'

/** Kilometres per degree of latitude (mean). */
const KM_PER_DEGREE = 111.32
/** Smallest view, in degrees of latitude (about 6 km), so a single point still shows a place. */
const MINIMUM_VIEW_DEGREES = 0.055
const COLOURS = {
  recipient: { fill: '#e9b866', stroke: '#8a5a12', text: '#5c3b0a' },
  source: { fill: '#7fc0bc', stroke: '#194c4e', text: '#123a3c' },
  other: { fill: '#e2e8f0', stroke: '#94a3b8', text: '#64748b' },
  arrow: '#194c4e',
  frame: '#cbd5e1',
  paper: '#f8fafc',
  ink: '#334155',
} as const

export interface MapFigureOptions {
  /** Figure size in PDF points (1/72 inch). */
  width: number
  height: number
  /** Font family for labels (must be registered with pdfmake). */
  fontFamily?: string
}

interface View {
  lon0: number
  lat0: number
  cosLat0: number
  /** Points per projected unit (degree of latitude). */
  scale: number
  offsetX: number
  offsetY: number
}

function escapeXml(text: string): string {
  return text.replace(/[<>&"']/g, char => ({ '<': '&lt;', '>': '&gt;', '&': '&amp;', '"': '&quot;', '\'': '&apos;' })[char] ?? char)
}

/** Every position of a geometry we draw (Polygon, MultiPolygon, Point). */
function positionsOf(geometry: Geometry | null): Position[] {
  if (!geometry) return []
  switch (geometry.type) {
    case 'Point': return [geometry.coordinates]
    case 'Polygon': return geometry.coordinates.flat()
    case 'MultiPolygon': return geometry.coordinates.flat(2)
    default: return []
  }
}

/** Longitude brought within 180° of `lon0`. */
function unwrap(lon: number, lon0: number): number {
  let value = lon
  while (value - lon0 > 180) value -= 360
  while (value - lon0 < -180) value += 360
  return value
}

function project(view: View, position: Position): [number, number] {
  const lon = position[0] ?? 0
  const lat = position[1] ?? 0
  const x = (unwrap(lon, view.lon0) - view.lon0) * view.cosLat0
  return [view.offsetX + x * view.scale, view.offsetY - (lat - view.lat0) * view.scale]
}

/** Fits the involved subpopulations into the figure with a margin. */
function fitView(involved: readonly BriefSubpopulation[], width: number, height: number): View | null {
  const positions = involved.flatMap(sub => [...positionsOf(sub.geometry), ...(sub.centroid ? [sub.centroid] : [])])
  const first = positions[0]
  if (!first) return null
  const lon0Guess = first[0] ?? 0
  let [minLon, maxLon, minLat, maxLat] = [Infinity, -Infinity, Infinity, -Infinity]
  for (const position of positions) {
    const lon = unwrap(position[0] ?? 0, lon0Guess)
    const lat = position[1] ?? 0
    minLon = Math.min(minLon, lon)
    maxLon = Math.max(maxLon, lon)
    minLat = Math.min(minLat, lat)
    maxLat = Math.max(maxLat, lat)
  }
  const lat0 = (minLat + maxLat) / 2
  const lon0 = (minLon + maxLon) / 2
  const cosLat0 = Math.max(Math.cos((lat0 * Math.PI) / 180), 0.05)
  const spanX = Math.max((maxLon - minLon) * cosLat0, MINIMUM_VIEW_DEGREES)
  const spanY = Math.max(maxLat - minLat, MINIMUM_VIEW_DEGREES)
  // 14% margin on every side leaves room for labels, the scale bar and the north arrow.
  const scale = Math.min((width * 0.72) / spanX, (height * 0.72) / spanY)
  return { lon0, lat0, cosLat0, scale, offsetX: width / 2, offsetY: height / 2 }
}

function ringPath(view: View, ring: readonly Position[]): string {
  const points = ring.map(position => project(view, position))
  return points.map(([x, y], index) => `${index === 0 ? 'M' : 'L'}${x.toFixed(2)} ${y.toFixed(2)}`).join(' ') + ' Z'
}

function shape(view: View, sub: BriefSubpopulation): string {
  const colours = COLOURS[sub.role]
  const opacity = sub.role === 'other' ? 0.55 : 0.8
  const geometry = sub.geometry
  const style = `fill="${colours.fill}" fill-opacity="${opacity}" stroke="${colours.stroke}" stroke-width="${sub.role === 'other' ? 0.6 : 1.1}"`
  if (geometry?.type === 'Polygon' || geometry?.type === 'MultiPolygon') {
    const polygons = geometry.type === 'Polygon' ? [geometry.coordinates] : geometry.coordinates
    const d = polygons.flatMap(rings => rings.map(ring => ringPath(view, ring))).join(' ')
    return `<path d="${d}" fill-rule="evenodd" ${style}/>`
  }
  const point = geometry?.type === 'Point' ? geometry.coordinates : sub.centroid
  if (!point) return ''
  const [x, y] = project(view, point)
  return `<circle cx="${x.toFixed(2)}" cy="${y.toFixed(2)}" r="${sub.role === 'other' ? 3 : 5}" ${style}/>`
}

function centreOf(view: View, sub: BriefSubpopulation): [number, number] | null {
  const point = sub.centroid ?? positionsOf(sub.geometry)[0]
  return point ? project(view, point) : null
}

/** A curved arrow from `from` to `to`, stopping `gap` points short of both ends. */
function arrow(from: [number, number], to: [number, number], gap: number): string {
  const [x1, y1] = from
  const [x2, y2] = to
  const length = Math.hypot(x2 - x1, y2 - y1)
  if (length < 2 * gap + 8) return ''
  const ux = (x2 - x1) / length
  const uy = (y2 - y1) / length
  const start: [number, number] = [x1 + ux * gap, y1 + uy * gap]
  const end: [number, number] = [x2 - ux * gap, y2 - uy * gap]
  // Bend to the left of the direction of travel by 12% of the length.
  const bend = 0.12 * length
  const control: [number, number] = [(start[0] + end[0]) / 2 - uy * bend, (start[1] + end[1]) / 2 + ux * bend]
  // Tangent at the end of a quadratic curve: end − control.
  const tx = end[0] - control[0]
  const ty = end[1] - control[1]
  const tl = Math.hypot(tx, ty) || 1
  const [dx, dy] = [tx / tl, ty / tl]
  const head = 9
  const baseX = end[0] - dx * head
  const baseY = end[1] - dy * head
  const left = `${(baseX - dy * head * 0.5).toFixed(2)},${(baseY + dx * head * 0.5).toFixed(2)}`
  const right = `${(baseX + dy * head * 0.5).toFixed(2)},${(baseY - dx * head * 0.5).toFixed(2)}`
  const curve = `M${start[0].toFixed(2)} ${start[1].toFixed(2)} Q${control[0].toFixed(2)} ${control[1].toFixed(2)} ${baseX.toFixed(2)} ${baseY.toFixed(2)}`
  return `<path d="${curve}" fill="none" stroke="#ffffff" stroke-width="5" stroke-linecap="round" stroke-opacity="0.85"/>`
    + `<path d="${curve}" fill="none" stroke="${COLOURS.arrow}" stroke-width="2.2" stroke-linecap="round"/>`
    + `<polygon points="${end[0].toFixed(2)},${end[1].toFixed(2)} ${left} ${right}" fill="${COLOURS.arrow}"/>`
}

/** A label with a white halo (drawn twice: halo, then ink). */
function label(x: number, y: number, text: string, colour: string, fontFamily: string, options: { size?: number, weight?: 'normal' | 'bold', anchor?: 'start' | 'middle' | 'end' } = {}): string {
  const size = options.size ?? 8.5
  const weight = options.weight ?? 'bold'
  const anchor = options.anchor ?? 'middle'
  const common = `x="${x.toFixed(2)}" y="${y.toFixed(2)}" font-family="${fontFamily}" font-size="${size}" font-weight="${weight}" text-anchor="${anchor}"`
  const safe = escapeXml(text)
  return `<text ${common} fill="none" stroke="#ffffff" stroke-width="2.6" stroke-linejoin="round">${safe}</text>`
    + `<text ${common} fill="${colour}">${safe}</text>`
}

/**
 * A length for the scale bar: 1, 2 or 5 × 10ⁿ km, the largest not above `maxKm`.
 *
 * @example niceScaleLength(7.3) // 5
 * @example niceScaleLength(0.31) // 0.2
 */
export function niceScaleLength(maxKm: number): number {
  if (!(maxKm > 0)) return 1
  const power = 10 ** Math.floor(Math.log10(maxKm))
  for (const step of [5, 2, 1]) {
    if (step * power <= maxKm) return step * power
  }
  return power
}

function scaleBar(view: View, height: number, fontFamily: string): string {
  const kmPerPoint = KM_PER_DEGREE / view.scale
  const lengthKm = niceScaleLength(110 * kmPerPoint)
  const lengthPt = lengthKm / kmPerPoint
  const x = 14
  const y = height - 18
  const half = lengthPt / 2
  const text = `${lengthKm >= 1 ? lengthKm.toLocaleString('en-US') : lengthKm} km`
  return `<rect x="${x - 4}" y="${y - 15}" width="${lengthPt + 8 + 34}" height="24" rx="3" fill="#ffffff" fill-opacity="0.85"/>`
    + `<rect x="${x}" y="${y}" width="${half.toFixed(2)}" height="4" fill="${COLOURS.ink}"/>`
    + `<rect x="${(x + half).toFixed(2)}" y="${y}" width="${half.toFixed(2)}" height="4" fill="#ffffff" stroke="${COLOURS.ink}" stroke-width="0.8"/>`
    + `<rect x="${x}" y="${y}" width="${lengthPt.toFixed(2)}" height="4" fill="none" stroke="${COLOURS.ink}" stroke-width="0.8"/>`
    + `<text x="${x}" y="${y - 4}" font-family="${fontFamily}" font-size="7.5" fill="${COLOURS.ink}">0</text>`
    + `<text x="${(x + lengthPt).toFixed(2)}" y="${y - 4}" font-family="${fontFamily}" font-size="7.5" fill="${COLOURS.ink}" text-anchor="middle">${escapeXml(text)}</text>`
}

function northArrow(width: number, fontFamily: string): string {
  const x = width - 24
  const y = 16
  return `<circle cx="${x}" cy="${y + 14}" r="15" fill="#ffffff" fill-opacity="0.85"/>`
    + `<polygon points="${x},${y + 4} ${x + 6},${y + 24} ${x},${y + 19}" fill="${COLOURS.ink}"/>`
    + `<polygon points="${x},${y + 4} ${x - 6},${y + 24} ${x},${y + 19}" fill="#ffffff" stroke="${COLOURS.ink}" stroke-width="0.8"/>`
    + `<text x="${x}" y="${y + 2}" font-family="${fontFamily}" font-size="8" font-weight="bold" fill="${COLOURS.ink}" text-anchor="middle">N</text>`
}

function legend(width: number, height: number, fontFamily: string, hasOthers: boolean): string {
  const items: { colour: { fill: string, stroke: string }, text: string }[] = [
    { colour: COLOURS.recipient, text: 'Recipient' },
    { colour: COLOURS.source, text: 'Source' },
  ]
  if (hasOthers) items.push({ colour: COLOURS.other, text: 'Other subpopulations' })
  const widths = items.map(item => 18 + item.text.length * 4.4)
  const total = widths.reduce((sum, w) => sum + w, 0) + 10
  let x = width - total - 6
  const y = height - 20
  let out = `<rect x="${x - 2}" y="${y - 6}" width="${total}" height="18" rx="3" fill="#ffffff" fill-opacity="0.85"/>`
  x += 4
  items.forEach((item, index) => {
    out += `<rect x="${x.toFixed(2)}" y="${y - 1}" width="10" height="8" fill="${item.colour.fill}" stroke="${item.colour.stroke}" stroke-width="0.8"/>`
    out += `<text x="${(x + 13).toFixed(2)}" y="${y + 6}" font-family="${fontFamily}" font-size="7.5" fill="${COLOURS.ink}">${escapeXml(item.text)}</text>`
    x += widths[index] ?? 0
  })
  return out
}

/**
 * Draws the map figure.
 *
 * @param subpopulations - the recipient, its sources and (optionally) others of the species
 * @param options - size in points, label font
 * @returns an SVG document string, or null when no involved subpopulation has a location
 */
export function briefMapSvg(subpopulations: readonly BriefSubpopulation[], options: MapFigureOptions): string | null {
  const { width, height } = options
  const fontFamily = options.fontFamily ?? 'Inter'
  const involved = subpopulations.filter(sub => sub.role !== 'other')
  const view = fitView(involved, width, height)
  if (!view) return null

  const inView = (sub: BriefSubpopulation) => {
    const centre = centreOf(view, sub)
    return centre !== null && centre[0] > -width * 0.2 && centre[0] < width * 1.2 && centre[1] > -height * 0.2 && centre[1] < height * 1.2
  }
  const others = subpopulations.filter(sub => sub.role === 'other' && inView(sub))
  const recipient = involved.find(sub => sub.role === 'recipient')
  const sources = involved.filter(sub => sub.role === 'source')

  const parts: string[] = []
  parts.push(`<rect x="0" y="0" width="${width}" height="${height}" fill="${COLOURS.paper}"/>`)
  parts.push('<g clip-path="url(#frame)">')
  for (const sub of others) parts.push(shape(view, sub))
  for (const sub of sources) parts.push(shape(view, sub))
  if (recipient) parts.push(shape(view, recipient))
  const recipientCentre = recipient ? centreOf(view, recipient) : null
  if (recipientCentre) {
    for (const source of sources) {
      const from = centreOf(view, source)
      if (from) parts.push(arrow(from, recipientCentre, 10))
    }
  }
  for (const sub of others) {
    const centre = centreOf(view, sub)
    if (centre) parts.push(label(centre[0], centre[1] + 3, sub.name, COLOURS.other.text, fontFamily, { size: 6.5, weight: 'normal' }))
  }
  for (const sub of [...sources, ...(recipient ? [recipient] : [])]) {
    const centre = centreOf(view, sub)
    if (!centre) continue
    const role = sub.role === 'recipient' ? 'recipient' : 'source'
    parts.push(label(centre[0], centre[1] - 9, sub.name, COLOURS[role].text, fontFamily, { size: 8.5 }))
    parts.push(label(centre[0], centre[1] + 1, role, COLOURS[role].text, fontFamily, { size: 6.5, weight: 'normal' }))
  }
  parts.push('</g>')
  parts.push(scaleBar(view, height, fontFamily))
  parts.push(northArrow(width, fontFamily))
  parts.push(legend(width, height, fontFamily, others.length > 0))
  parts.push(`<rect x="0.5" y="0.5" width="${width - 1}" height="${height - 1}" fill="none" stroke="${COLOURS.frame}" stroke-width="1"/>`)

  return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">`
    + `<defs><clipPath id="frame"><rect x="0" y="0" width="${width}" height="${height}"/></clipPath></defs>`
    + parts.join('')
    + '</svg>'
}

/**
 * The words under the map: projection and centre, so a reader knows how far to trust distances.
 *
 * @example mapCaption([recipient, source]) // 'Boundaries as recorded in Tributary. Equirectangular projection centred on 35.50° N, 83.50° W; …'
 */
export function mapCaption(subpopulations: readonly BriefSubpopulation[]): string {
  const view = fitView(subpopulations.filter(sub => sub.role !== 'other'), 100, 100)
  if (!view) return 'No location is recorded for these subpopulations.'
  const lat = `${Math.abs(view.lat0).toFixed(2)}° ${view.lat0 >= 0 ? 'N' : 'S'}`
  let lon0 = view.lon0
  while (lon0 > 180) lon0 -= 360
  while (lon0 < -180) lon0 += 360
  const lon = `${Math.abs(lon0).toFixed(2)}° ${lon0 >= 0 ? 'E' : 'W'}`
  return `Boundaries as recorded in Tributary. Equirectangular projection centred on ${lat}, ${lon}; the scale bar is true at the centre latitude. Arrows run from each source to the recipient.`
}
