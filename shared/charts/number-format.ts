/**
 * How the record page, its charts and the brief print figures, so one number reads the same
 * everywhere. Pure; en-GB grouping (1,366).
 */

/**
 * An effective size for display: whole individuals from 100 up, one decimal below.
 *
 * @example formatEffectiveSize(1365.6)  // '1,366'
 * @example formatEffectiveSize(30.64)   // '30.6'
 * @example formatEffectiveSize(48)      // '48'
 * @example formatEffectiveSize(0.6)     // '0.6'
 */
export function formatEffectiveSize(value: number): string {
  if (!Number.isFinite(value)) return '—'
  const digits = Math.abs(value) >= 100 ? 0 : 1
  return value.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: 0 })
}

/**
 * A coefficient in [0, 1] (F, H, relative fitness) with three decimals.
 *
 * @example formatCoefficient(0.0956179)  // '0.096'
 * @example formatCoefficient(1)          // '1.000'
 */
export function formatCoefficient(value: number): string {
  return Number.isFinite(value) ? value.toFixed(3) : '—'
}

/**
 * A change of a proportion as signed percentage points of its starting value, e.g. fitness
 * 0.82 → '−18%'.
 *
 * @example formatLoss(0.82)  // '−18%'
 * @example formatLoss(1)     // '0%'
 */
export function formatLoss(ratio: number): string {
  if (!Number.isFinite(ratio)) return '—'
  const percent = Math.round((ratio - 1) * 100)
  return percent === 0 ? '0%' : `${percent < 0 ? '−' : '+'}${Math.abs(percent)}%`
}

/**
 * A generation count for sentences: whole numbers as they are, others with one decimal.
 *
 * @example formatGenerations(16.666)  // '16.7'
 * @example formatGenerations(20)      // '20'
 */
export function formatGenerations(value: number): string {
  return Number.isInteger(value) ? String(value) : value.toFixed(1)
}
