/**
 * How the status scale looks: the colour of each status (the tailwind tokens `status.*` in
 * tailwind.config.ts — Leaflet needs them as values; tests/unit/atlas/colours.test.ts keeps the
 * two in step) and the map styles of a subpopulation in its states (normal, hovered, selected).
 */
import { NE_BANDS, type NeBandKey, type StatusKey } from '#shared/atlas/status'

/** Hex colour of each status; 'unknown' is slate-400. */
export const ATLAS_STATUS_COLOURS: Readonly<Record<StatusKey, string>> = {
  critical: '#6b2d5c',
  declining: '#b5562a',
  watch: '#c9a227',
  stable: '#3f8f6b',
  connected: '#1d4e89',
  unknown: '#94a3b8',
}

/**
 * The status colour for words on white: the token where it already reaches 4.5:1 (WCAG AA),
 * else the same hue darkened until it does (stable, watch); 'unknown' is slate-500.
 */
export const ATLAS_STATUS_TEXT_COLOURS: Readonly<Record<StatusKey, string>> = {
  critical: '#6b2d5c',
  declining: '#b5562a',
  watch: '#8d711b',
  stable: '#398261',
  connected: '#1d4e89',
  unknown: '#5a6a80',
}

/** Marker radius (px) of an Ne band; records without one get the smallest. */
export function atlasBandRadius(band: NeBandKey | null): number {
  return NE_BANDS.find(item => item.key === band)?.radius ?? 5
}

/** Leaflet path options of a boundary. */
export function atlasBoundaryStyle(status: StatusKey, state: 'normal' | 'hovered' | 'selected') {
  const colour = ATLAS_STATUS_COLOURS[status]
  return {
    color: state === 'normal' ? colour : '#0a2628',
    weight: state === 'selected' ? 3 : state === 'hovered' ? 2.5 : 1.5,
    opacity: 1,
    fillColor: colour,
    fillOpacity: state === 'selected' ? 0.5 : state === 'hovered' ? 0.42 : 0.3,
  }
}

/** Leaflet circle-marker options of the Ne-band marker at a centroid or point. */
export function atlasMarkerStyle(status: StatusKey, band: NeBandKey | null, state: 'normal' | 'hovered' | 'selected') {
  const radius = atlasBandRadius(band)
  return {
    radius: state === 'normal' ? radius : radius + 2,
    color: state === 'normal' ? '#ffffff' : '#0a2628',
    weight: state === 'normal' ? 1.5 : 2.5,
    opacity: 1,
    fillColor: ATLAS_STATUS_COLOURS[status],
    fillOpacity: 0.95,
  }
}
