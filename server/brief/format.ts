/**
 * How numbers and dates print in a brief. One place, so the cover, the tables and the charts
 * agree. Pure; dates print in UTC so the same data gives the same document on any server.
 */

/**
 * Probabilities print as everywhere else in Tributary (shared/proposals/format.ts): '13.6%',
 * '0.042%', '< 1 in a million'.
 */
export { formatProbability } from '../../shared/proposals/format'

/**
 * A value with a fixed number of decimals (F, H, fitness: 3).
 *
 * @example formatFixed(0.09561, 3) // '0.096'
 */
export function formatFixed(value: number, digits: number): string {
  return Number.isFinite(value) ? value.toFixed(digits) : '—'
}

/**
 * Expected relative fitness: two decimals, or two significant figures below 0.1 (a badly
 * inbred population's fitness is small but not zero, and '0.00' would say it is).
 *
 * @example formatFitness(0.8123) // '0.81'
 * @example formatFitness(0.00853) // '0.0085'
 */
export function formatFitness(value: number): string {
  if (!Number.isFinite(value)) return '—'
  if (value >= 0.1 || value === 0) return value.toFixed(2)
  return String(Number(value.toPrecision(2)))
}

/**
 * A count or size with thousands separators and at most `digits` decimals.
 *
 * @example formatNumber(12345.678) // '12,346'
 * @example formatNumber(3.14159, 2) // '3.14'
 */
export function formatNumber(value: number | null | undefined, digits = 0): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—'
  return value.toLocaleString('en-US', { maximumFractionDigits: digits, minimumFractionDigits: 0 })
}

/**
 * Effective migrants per generation: two significant figures below 10.
 *
 * @example formatMigrants(0.4167) // '0.42'
 * @example formatMigrants(12.5)   // '13'
 */
export function formatMigrants(value: number): string {
  if (!Number.isFinite(value)) return '—'
  if (value === 0) return '0'
  if (value >= 10) return value.toFixed(0)
  return String(Number(value.toPrecision(2)))
}

/**
 * A relative change as a signed percentage.
 *
 * @example formatChange(1.25, 1) // '+25%'
 * @example formatChange(0.8, 1)  // '−20%'
 */
export function formatChange(value: number, reference: number): string {
  if (!(reference > 0) || !Number.isFinite(value)) return '—'
  const change = (value / reference - 1) * 100
  const rounded = Math.abs(change) >= 10 ? change.toFixed(0) : change.toFixed(1)
  if (Number(rounded) === 0) return '±0%'
  return change > 0 ? `+${rounded}%` : `−${rounded.replace('-', '')}%`
}

const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December']

/**
 * A date as people write it (UTC), e.g. '2 December 2026'; '—' for null or an invalid date.
 */
export function formatDate(iso: string | null | undefined): string {
  if (!iso) return '—'
  const date = new Date(iso)
  if (Number.isNaN(date.getTime())) return '—'
  return `${date.getUTCDate()} ${MONTHS[date.getUTCMonth()]} ${date.getUTCFullYear()}`
}

/** A date and time in UTC, e.g. '2 December 2026, 14:05 UTC'. */
export function formatDateTime(iso: string | null | undefined): string {
  if (!iso) return '—'
  const date = new Date(iso)
  if (Number.isNaN(date.getTime())) return '—'
  const hh = String(date.getUTCHours()).padStart(2, '0')
  const mm = String(date.getUTCMinutes()).padStart(2, '0')
  return `${formatDate(iso)}, ${hh}:${mm} UTC`
}

/** "1 release" / "3 releases". */
export function plural(count: number, one: string, many: string): string {
  return `${formatNumber(count)} ${count === 1 ? one : many}`
}

/** Years, without a trailing ".0": 5 → '5', 2.5 → '2.5'. */
export function formatYears(value: number): string {
  return formatNumber(value, 1)
}
