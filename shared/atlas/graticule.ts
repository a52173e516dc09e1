/**
 * A latitude/longitude grid for the offline map: at regional zooms Natural Earth's country
 * outlines show little, so grid lines with their degrees give orientation. Picks a round step
 * that draws about `targetLines` lines across the view.
 */

/** Grid steps in degrees, finest first. */
export const GRATICULE_STEPS = [0.05, 0.1, 0.25, 0.5, 1, 2, 5, 10, 15, 30] as const

/**
 * The grid step for a view `spanDegrees` wide.
 *
 * @param spanDegrees - the larger of the view's width and height, degrees
 * @param targetLines - about how many lines to draw across it (default 6)
 * @example graticuleStep(2)   // 0.25
 * @example graticuleStep(360) // 30
 */
export function graticuleStep(spanDegrees: number, targetLines = 6): number {
  for (const step of GRATICULE_STEPS) if (spanDegrees / step <= targetLines * 1.5) return step
  return GRATICULE_STEPS[GRATICULE_STEPS.length - 1] as number
}

/**
 * Grid values (multiples of `step`) from `from` to `to`, inclusive where they fall.
 *
 * @example graticuleValues(35.1, 36.2, 0.5) // [35.5, 36]
 */
export function graticuleValues(from: number, to: number, step: number): number[] {
  const values: number[] = []
  const first = Math.ceil(from / step)
  const last = Math.floor(to / step)
  for (let k = first; k <= last && values.length < 400; k += 1) values.push(Math.round(k * step * 1e6) / 1e6)
  return values
}

/**
 * A grid label: 35.5 → '35.5° N', -83.25 → '83.25° W', 0 → '0°'.
 *
 * @param value - degrees
 * @param axis - 'lat' or 'lon'
 */
export function graticuleLabel(value: number, axis: 'lat' | 'lon'): string {
  if (value === 0) return '0°'
  const hemisphere = axis === 'lat' ? (value > 0 ? 'N' : 'S') : (value > 0 ? 'E' : 'W')
  const wrapped = axis === 'lon' ? ((((value + 180) % 360) + 360) % 360) - 180 : value
  if (axis === 'lon' && Math.abs(wrapped) === 180) return '180°'
  const magnitude = Math.abs(axis === 'lon' ? wrapped : value)
  return `${Number(magnitude.toFixed(2))}° ${axis === 'lon' ? (wrapped > 0 ? 'E' : 'W') : hemisphere}`
}
