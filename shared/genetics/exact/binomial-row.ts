/**
 * One row of the Wright–Fisher transition matrix: the Binomial(n, p′)
 * probabilities of the next generation's copy number, truncated where they
 * become negligible.
 *
 * Method: start at the mode m = ⌊(n+1)·p′⌋ with the value 1 and walk outward
 * with the exact ratio of neighbouring terms,
 *   P(j+1)/P(j) = (n−j)/(j+1) · p′/q′,
 * stopping at the first term below the tail's cutoff (relative to the mode);
 * then divide by the sum of the kept terms. No factorial, power or
 * log-gamma is ever formed, so nothing overflows or underflows at 2N = 4000 or
 * more; this is the log-space evaluation's stability without its rounding
 * (each term carries ≤ ~3 rounding errors per step from the mode: relative
 * error ≤ 4·10⁻¹³ at the far tail of a 2N = 4000 row, ~10⁻¹⁵ near the mode).
 * Because the binomial is log-concave, each dropped tail is bounded by a
 * geometric series from the last kept term (`fillBinomialRow` returns both).
 */

/** Extent of a truncated row: kept columns are low..high (inclusive). */
export interface RowExtent { low: number, high: number, mode: number }

function modeOf(geneCopies: number, numerator: number, denominator: number): number {
  const frequency = numerator / (numerator + denominator)
  return Math.min(geneCopies, Math.floor((geneCopies + 1) * frequency))
}

/**
 * Columns kept in a row: terms ≥ `lowerCutoff` (below the mode) and
 * ≥ `upperCutoff` (above the mode), both relative to the mode's term.
 */
export function binomialRowExtent(
  geneCopies: number, numerator: number, denominator: number, lowerCutoff: number, upperCutoff: number,
): RowExtent {
  const mode = modeOf(geneCopies, numerator, denominator)
  const odds = numerator / denominator
  const inverseOdds = denominator / numerator
  let low = mode
  for (let value = 1; low > 0; low--) {
    value *= low / (geneCopies - low + 1) * inverseOdds
    if (value < lowerCutoff) break
  }
  let high = mode
  for (let value = 1; high < geneCopies; high++) {
    value *= (geneCopies - high) / (high + 1) * odds
    if (value < upperCutoff) break
  }
  return { low, high, mode }
}

/** Bounds on the probability dropped below `low` and above `high` (scaled like the row). */
export interface DroppedTails { below: number, above: number }

/**
 * Writes the normalised probabilities of columns `extent.low..extent.high`,
 * multiplied by `scale`, into `scratch[low..high]` (length ≥ n + 1), for the
 * extent returned by `binomialRowExtent` with the same arguments.
 *
 * Also bounds each dropped tail: the binomial is log-concave, so beyond the
 * last kept term T the terms shrink at least geometrically with the ratio r
 * of the first dropped one, and the tail is ≤ T·r/(1 − r) (∞ if r ≥ 1).
 */
export function fillBinomialRow(
  geneCopies: number, numerator: number, denominator: number, extent: RowExtent,
  scratch: Float64Array, scale: number,
): DroppedTails {
  const { low, high, mode } = extent
  const odds = numerator / denominator
  const inverseOdds = denominator / numerator
  scratch[mode] = 1
  let value = 1
  for (let j = mode; j > low; j--) {
    value *= j / (geneCopies - j + 1) * inverseOdds
    scratch[j - 1] = value
  }
  value = 1
  for (let j = mode; j < high; j++) {
    value *= (geneCopies - j) / (j + 1) * odds
    scratch[j + 1] = value
  }
  // Sum the small tail terms first (both ends inward) for the best rounding.
  let lowerSum = 0
  for (let j = low; j < mode; j++) lowerSum += scratch[j] ?? 0
  let upperSum = 0
  for (let j = high; j > mode; j--) upperSum += scratch[j] ?? 0
  const factor = scale / (lowerSum + upperSum + 1)
  for (let j = low; j <= high; j++) scratch[j] = (scratch[j] ?? 0) * factor
  const geometricTail = (edge: number, ratio: number): number =>
    ratio < 1 ? edge * ratio / (1 - ratio) : Number.POSITIVE_INFINITY
  return {
    below: low === 0 ? 0 : geometricTail(scratch[low] ?? 0, low / (geneCopies - low + 1) * inverseOdds),
    above: high === geneCopies ? 0 : geometricTail(scratch[high] ?? 0, (geneCopies - high) / (high + 1) * odds),
  }
}
