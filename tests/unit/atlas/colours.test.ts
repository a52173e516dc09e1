/**
 * The map draws with the hex colours of composables/useAtlasStyle.ts; the rest of the interface
 * with the tailwind tokens `status.*`. They must be the same colours.
 */
import { describe, expect, it } from 'vitest'
import tailwind from '../../../tailwind.config'
import { ATLAS_STATUS_COLOURS, ATLAS_STATUS_TEXT_COLOURS, atlasBandRadius, atlasBoundaryStyle, atlasMarkerStyle } from '../../../composables/useAtlasStyle'

describe('status colours', () => {
  it('match the tailwind status tokens', () => {
    const tokens = (tailwind.theme?.extend?.colors as Record<string, Record<string, string>>).status
    expect(tokens).toBeDefined()
    for (const key of ['critical', 'declining', 'watch', 'stable', 'connected'] as const) expect(ATLAS_STATUS_COLOURS[key], key).toBe(tokens?.[key])
  })

  it('status words on white reach 4.5:1 contrast (WCAG 2.x AA, relative-luminance formula)', () => {
    const luminance = (hex: string) => {
      const [r, g, b] = [1, 3, 5].map((start) => {
        const c = Number.parseInt(hex.slice(start, start + 2), 16) / 255
        return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4
      }) as [number, number, number]
      return 0.2126 * r + 0.7152 * g + 0.0722 * b
    }
    for (const [key, colour] of Object.entries(ATLAS_STATUS_TEXT_COLOURS)) {
      expect(1.05 / (luminance(colour) + 0.05), key).toBeGreaterThanOrEqual(4.5)
    }
    // Where the token itself passes, the words use the token unchanged.
    for (const key of ['critical', 'declining', 'connected'] as const) expect(ATLAS_STATUS_TEXT_COLOURS[key]).toBe(ATLAS_STATUS_COLOURS[key])
  })

  it('styles grow with the Ne band and stand out when hovered or selected', () => {
    expect(atlasBandRadius('under-50')).toBeLessThan(atlasBandRadius('1000-plus'))
    expect(atlasBandRadius(null)).toBe(atlasBandRadius('under-50'))
    expect(atlasMarkerStyle('watch', '100-499', 'selected').radius).toBeGreaterThan(atlasMarkerStyle('watch', '100-499', 'normal').radius)
    expect(atlasBoundaryStyle('critical', 'selected').weight).toBeGreaterThan(atlasBoundaryStyle('critical', 'normal').weight)
    expect(atlasBoundaryStyle('critical', 'normal').fillColor).toBe(ATLAS_STATUS_COLOURS.critical)
  })
})
