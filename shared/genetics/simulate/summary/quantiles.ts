/** The five quantiles the simulations report for bands and waiting times. */
export interface Quantiles {
  q05: number | null
  q25: number | null
  q50: number | null
  q75: number | null
  q95: number | null
}

/** Probabilities of the reported quantiles, in the order of `Quantiles`. */
export const QUANTILE_PROBABILITIES = [0.05, 0.25, 0.5, 0.75, 0.95] as const

/**
 * Sample quantile of sorted data by linear interpolation between order
 * statistics (Hyndman & Fan 1996, The American Statistician 50:361–365,
 * definition 7 — the default of R and numpy): with h = (n − 1)·prob,
 * Q = x₍⌊h⌋₎ + (h − ⌊h⌋)·(x₍⌊h⌋+1₎ − x₍⌊h⌋₎), 0-based.
 *
 * @param sorted - values in ascending order (not checked)
 * @param probability - in [0, 1]
 * @returns the quantile, or null when there are no values
 * @example quantileOfSorted([1, 2, 3, 4], 0.5) // 2.5
 * @example quantileOfSorted([7], 0.95)         // 7
 * @example quantileOfSorted([], 0.5)           // null
 */
export function quantileOfSorted(sorted: ArrayLike<number>, probability: number): number | null {
  const count = sorted.length
  if (count === 0) return null
  const position = (count - 1) * probability
  const below = Math.floor(position)
  const lower = sorted[below] as number // 0 ≤ below ≤ count − 1
  if (below >= count - 1) return lower
  const upper = sorted[below + 1] as number
  return lower + (position - below) * (upper - lower)
}

/**
 * The five reported quantiles (5, 25, 50, 75, 95 %) of a set of values.
 *
 * @param values - any order; not modified
 * @returns quantiles by `quantileOfSorted`; all null for an empty set
 * @example quantilesOf([3, 1, 2]) // { q05: 1.1, q25: 1.5, q50: 2, q75: 2.5, q95: 2.9 }
 */
export function quantilesOf(values: ArrayLike<number>): Quantiles {
  const sorted = Float64Array.from(values as ArrayLike<number>).sort()
  return {
    q05: quantileOfSorted(sorted, 0.05),
    q25: quantileOfSorted(sorted, 0.25),
    q50: quantileOfSorted(sorted, 0.5),
    q75: quantileOfSorted(sorted, 0.75),
    q95: quantileOfSorted(sorted, 0.95),
  }
}

/**
 * Quantile of values given as a histogram over known bin values, with the
 * same definition 7 as `quantileOfSorted` applied to the expanded data.
 *
 * @param counts - counts[i] = number of values equal to binValue(i), ≥ 0
 * @param binValue - value of bin i, increasing in i
 * @param probability - in [0, 1]
 * @returns the quantile, or null when all counts are zero
 * @example quantileOfHistogram([1, 0, 3], i => i / 2, 0.5) // 1
 */
export function quantileOfHistogram(counts: ArrayLike<number>, binValue: (bin: number) => number, probability: number): number | null {
  let total = 0
  for (let i = 0; i < counts.length; i++) total += counts[i] ?? 0
  if (total === 0) return null
  const position = (total - 1) * probability
  const below = Math.floor(position)
  const lower = valueAtRank(counts, binValue, below)
  if (below >= total - 1) return lower
  const upper = valueAtRank(counts, binValue, below + 1)
  return lower + (position - below) * (upper - lower)
}

/** Value of the 0-based rank-th smallest item of a histogram. */
function valueAtRank(counts: ArrayLike<number>, binValue: (bin: number) => number, rank: number): number {
  let seen = 0
  for (let bin = 0; bin < counts.length; bin++) {
    seen += counts[bin] ?? 0
    if (seen > rank) return binValue(bin)
  }
  return binValue(counts.length - 1)
}

/**
 * Mean of values added in ascending order, so the floating-point result does
 * not depend on how replicates were split between workers.
 *
 * @param values - any order; not modified
 * @returns the arithmetic mean, or null for an empty set
 * @example orderIndependentMean([3, 1, 2]) // 2
 * @example orderIndependentMean([])        // null
 */
export function orderIndependentMean(values: ArrayLike<number>): number | null {
  if (values.length === 0) return null
  const sorted = Float64Array.from(values as ArrayLike<number>).sort()
  let sum = 0
  for (const value of sorted) sum += value
  return sum / sorted.length
}
