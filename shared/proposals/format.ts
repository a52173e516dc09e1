/**
 * How proposal results print: one set of rules for the workspace, the compare page and the
 * PDF brief. Probabilities follow the display rule of SCIENCE.md §1.5 / §10: below one in a
 * million they read "< 1 in a million"; where the value underflows double precision, a power
 * of ten from its logarithm.
 */

const ONE_IN_A_MILLION = 1e-6

function significant(value: number, digits: number): string {
  if (value === 0) return '0'
  const text = value.toPrecision(digits)
  return text.includes('e') ? String(Number(text)) : text
}

/**
 * A probability as a percentage with sensible digits, or the display rule's words.
 *
 * @param probability - in [0, 1]
 * @param log10Probability - log₁₀ of it, used when the probability underflows to 0
 * @returns e.g. "13.6%", "4.81%", "0.042%", "< 1 in a million", "9.3 × 10^-8600"
 * @example formatProbability(0.13645)  // '13.6%'
 * @example formatProbability(0.0481)   // '4.81%'
 * @example formatProbability(4.2e-4)   // '0.042%'
 * @example formatProbability(3e-9)     // '< 1 in a million'
 * @example formatProbability(0, -8599.03)  // '9.3 × 10^-8600'
 */
export function formatProbability(probability: number, log10Probability?: number): string {
  if (!Number.isFinite(probability)) return '—'
  if (probability === 0 && log10Probability !== undefined && Number.isFinite(log10Probability) && log10Probability < -300) {
    const exponent = Math.floor(log10Probability)
    return `${(10 ** (log10Probability - exponent)).toFixed(1)} × 10^${exponent}`
  }
  if (probability === 0) return '0%'
  if (probability < ONE_IN_A_MILLION) return '< 1 in a million'
  if (probability >= 1) return '100%'
  if (probability > 0.999999) return '> 99.9999%'
  const percent = probability * 100
  if (percent >= 10) return `${percent.toFixed(1)}%`
  if (percent >= 1) return `${significant(percent, 3)}%`
  return `${significant(percent, 2)}%`
}

/**
 * The same probability as "about 1 in n" (for the sentence under the big figure).
 *
 * @example oneIn(0.0042)  // 'about 1 in 240'
 * @example oneIn(0.5)     // 'about 1 in 2'
 * @example oneIn(0)       // 'practically never'
 */
export function oneIn(probability: number): string {
  if (!(probability > 0)) return 'practically never'
  if (probability < ONE_IN_A_MILLION) return 'less than 1 in a million'
  if (probability >= 0.995) return 'almost certainly'
  const n = 1 / probability
  const rounded = n < 10 ? Math.round(n * 10) / 10 : Number(significant(n, 2))
  return `about 1 in ${rounded.toLocaleString('en-US')}`
}

/**
 * A signed relative difference as a percentage.
 *
 * @example formatRelative(0.0080416)  // '+0.80%'
 * @example formatRelative(-0.2851)    // '−29%'
 * @example formatRelative(null)       // '—'
 */
export function formatRelative(relative: number | null): string {
  if (relative === null || !Number.isFinite(relative)) return '—'
  const percent = relative * 100
  const magnitude = Math.abs(percent)
  const digits = magnitude >= 10 ? magnitude.toFixed(0) : magnitude >= 1 ? magnitude.toFixed(1) : magnitude.toFixed(2)
  return `${percent < 0 ? '−' : '+'}${digits}%`
}

/**
 * A plain number with a fixed number of significant digits and thousands separators.
 *
 * @example formatNumber(1234.567)     // '1,235'
 * @example formatNumber(0.31168, 2)   // '0.31'
 * @example formatNumber(46.29, 3)     // '46.3'
 */
export function formatNumber(value: number, digits = 3): string {
  if (!Number.isFinite(value)) return '—'
  if (Math.abs(value) >= 10 ** digits) return Math.round(value).toLocaleString('en-US')
  return Number(significant(value, digits)).toLocaleString('en-US', { maximumFractionDigits: 10 })
}

/**
 * Years, rounded for reading ("≈ 102 years").
 *
 * @example formatYears(101.84)  // '102 years'
 * @example formatYears(1)       // '1 year'
 */
export function formatYears(years: number): string {
  if (!Number.isFinite(years)) return '—'
  const rounded = years >= 10 ? Math.round(years) : Math.round(years * 10) / 10
  return `${rounded.toLocaleString('en-US')} ${rounded === 1 ? 'year' : 'years'}`
}
