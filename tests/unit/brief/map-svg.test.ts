/**
 * The map figure: projection, scale bar and the drawn parts. Distances are checked against the
 * great-circle distance (shared/atlas/spherical.ts), within the equirectangular projection's
 * error near the centre latitude (well under 1% for a view a few tens of km across).
 */
import { describe, expect, it } from 'vitest'
import type { Polygon } from 'geojson'
import { briefMapSvg, mapCaption, niceScaleLength } from '../../../server/brief/map-svg'
import type { BriefSubpopulation } from '../../../server/brief/types'

function sub(id: number, role: BriefSubpopulation['role'], centre: [number, number], halfSizeDegrees = 0.01): BriefSubpopulation {
  const [lon, lat] = centre
  const d = halfSizeDegrees
  const geometry: Polygon = { type: 'Polygon', coordinates: [[[lon - d, lat - d], [lon + d, lat - d], [lon + d, lat + d], [lon - d, lat + d], [lon - d, lat - d]]] }
  return {
    id, name: `Place ${id} <&>`, role, geometry, centroid: centre, areaKm2: 1, latestCensus: null, workingNe: null, workingNeReason: null,
    generationTimeYears: 2, yearsIsolated: null, environmentClass: null, distanceToRecipientKm: null,
  }
}

describe('niceScaleLength', () => {
  it('picks 1, 2 or 5 × 10ⁿ, the largest not above the limit', () => {
    expect(niceScaleLength(7.3)).toBe(5)
    expect(niceScaleLength(19.9)).toBe(10)
    expect(niceScaleLength(20)).toBe(20)
    expect(niceScaleLength(0.31)).toBeCloseTo(0.2, 12)
    expect(niceScaleLength(1234)).toBe(1000)
  })
  it('answers 1 for a limit that is not positive', () => {
    expect(niceScaleLength(0)).toBe(1)
    expect(niceScaleLength(Number.NaN)).toBe(1)
  })
})

describe('briefMapSvg', () => {
  const recipient = sub(1, 'recipient', [-83.5, 35.6])
  const source = sub(2, 'source', [-83.3, 35.7])

  it('returns null when no involved subpopulation has a location', () => {
    const nowhere = { ...recipient, geometry: null, centroid: null }
    expect(briefMapSvg([nowhere], { width: 400, height: 300 })).toBeNull()
  })

  it('draws both polygons, an arrow, a north arrow, a legend and escaped labels', () => {
    const svg = briefMapSvg([recipient, source], { width: 400, height: 300 }) ?? ''
    expect(svg.startsWith('<svg')).toBe(true)
    expect(svg.match(/<path d="M[^"]*Z"/g)?.length).toBe(2) // two polygons
    expect(svg).toContain(' Q') // the curved arrow
    expect(svg).toContain('>N</text>')
    expect(svg).toContain('Recipient')
    expect(svg).toContain('Place 1 &lt;&amp;&gt;')
    expect(svg).not.toContain('Place 1 <&>')
  })

  it('prints a scale bar whose length in km matches the great-circle distance at the centre latitude', () => {
    const svg = briefMapSvg([recipient, source], { width: 400, height: 300 }) ?? ''
    const label = /([\d.,]+) km<\/text>/.exec(svg)
    expect(label).not.toBeNull()
    const km = Number(label?.[1]?.replace(/,/g, ''))
    // The bar: the outlined rect drawn after the two halves, at x = 14.
    const bar = /<rect x="14" y="[\d.]+" width="([\d.]+)" height="4" fill="none"/.exec(svg)
    const barPoints = Number(bar?.[1])
    // Where the two centroids land, and how many km apart they are on the sphere.
    const centres = [...svg.matchAll(/<text x="([\d.-]+)" y="([\d.-]+)" font-family="Inter" font-size="8.5"[^>]*fill="#[0-9a-f]{6}">/g)]
    expect(centres).toHaveLength(2)
    const [a, b] = centres
    const dx = Number(a?.[1]) - Number(b?.[1])
    const dy = Number(a?.[2]) - Number(b?.[2]) // both labels sit 9 pt above their centroid
    const pointsApart = Math.hypot(dx, dy)
    const R = 6371.0088
    const toRad = Math.PI / 180
    const h = Math.sin(((35.7 - 35.6) * toRad) / 2) ** 2 + Math.cos(35.6 * toRad) * Math.cos(35.7 * toRad) * Math.sin((0.2 * toRad) / 2) ** 2
    const kmApart = 2 * R * Math.asin(Math.sqrt(h))
    // km per point from the figure's scale bar and from the two places must agree within 1%.
    expect((km / barPoints) / (kmApart / pointsApart)).toBeCloseTo(1, 1.7)
  })

  it('keeps other subpopulations faint and only those near the view', () => {
    const near = sub(3, 'other', [-83.4, 35.65])
    const far = sub(4, 'other', [-80, 40])
    const svg = briefMapSvg([recipient, source, near, far], { width: 400, height: 300 }) ?? ''
    expect(svg).toContain('Place 3')
    expect(svg).not.toContain('Place 4')
    expect(svg).toContain('Other subpopulations')
  })

  it('says where the projection is centred', () => {
    expect(mapCaption([recipient, source])).toMatch(/centred on 35\.65° N, 83\.40° W/)
  })
})
