/**
 * The map draws with the hex colours of composables/useAtlasStyle.ts; the rest of the interface
 * with the tailwind tokens `status.*`. They must be the same colours.
 */
import { describe, expect, it } from 'vitest'
import tailwind from '../../../tailwind.config'
import { ATLAS_STATUS_COLOURS, atlasBandRadius, atlasBoundaryStyle, atlasMarkerStyle } from '../../../composables/useAtlasStyle'

describe('status colours', () => {
  it('match the tailwind status tokens', () => {
    const tokens = (tailwind.theme?.extend?.colors as Record<string, Record<string, string>>).status
    expect(tokens).toBeDefined()
    for (const key of ['critical', 'declining', 'watch', 'stable', 'connected'] as const) expect(ATLAS_STATUS_COLOURS[key], key).toBe(tokens?.[key])
  })

  it('styles grow with the Ne band and stand out when hovered or selected', () => {
    expect(atlasBandRadius('under-50')).toBeLessThan(atlasBandRadius('1000-plus'))
    expect(atlasBandRadius(null)).toBe(atlasBandRadius('under-50'))
    expect(atlasMarkerStyle('watch', '100-499', 'selected').radius).toBeGreaterThan(atlasMarkerStyle('watch', '100-499', 'normal').radius)
    expect(atlasBoundaryStyle('critical', 'selected').weight).toBeGreaterThan(atlasBoundaryStyle('critical', 'normal').weight)
    expect(atlasBoundaryStyle('critical', 'normal').fillColor).toBe(ATLAS_STATUS_COLOURS.critical)
  })
})
