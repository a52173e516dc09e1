import { domainError } from '../../validate'
import { sampleBinomial } from './binomial'
import type { RandomStream } from './streams'

/**
 * One draw from Multinomial(trials; probabilities) by conditional binomials:
 * count_i ~ Binomial(n − Σ_(j<i) count_j, p_i / (1 − Σ_(j<i) p_j)), which is
 * exact (the multinomial factorises into these conditionals).
 *
 * Why: splitting the offspring of a generation among parents, or migrants
 * among genotype classes.
 *
 * @param random - seeded generator
 * @param trials - n, integer ≥ 0
 * @param probabilities - p_i ≥ 0, not all zero when n > 0; normalised
 *   internally so they need not sum to exactly 1
 * @returns a new Int32Array of counts summing to n
 * @throws RangeError if n is not a non-negative integer or a weight is
 *   negative, not finite, or all weights are zero with n > 0
 * @example sampleMultinomial(replicateStream(1, 0), 10, [1, 0, 0]) // Int32Array [10, 0, 0]
 * @example sampleMultinomial(replicateStream(1, 0), 0, [0.5, 0.5]) // Int32Array [0, 0]
 */
export function sampleMultinomial(random: RandomStream, trials: number, probabilities: readonly number[]): Int32Array {
  const fn = 'sampleMultinomial'
  if (!(trials >= 0) || !Number.isInteger(trials)) domainError(fn, 'trials', 'an integer ≥ 0', trials)
  let total = 0
  for (const weight of probabilities) {
    if (!(weight >= 0) || !Number.isFinite(weight)) domainError(fn, 'probabilities', 'finite numbers ≥ 0', weight)
    total += weight
  }
  const counts = new Int32Array(probabilities.length)
  if (trials === 0) return counts
  if (total === 0) domainError(fn, 'probabilities', 'not all zero', 0)
  // The last category with positive weight takes whatever is left, so the
  // counts always sum to n even when the running mass suffers rounding.
  let lastPositive = probabilities.length - 1
  while ((probabilities[lastPositive] ?? 0) === 0) lastPositive--
  let remainingTrials = trials
  let remainingMass = total
  for (let i = 0; i < lastPositive && remainingTrials > 0; i++) {
    const weight = probabilities[i] ?? 0
    const count = sampleBinomial(random, remainingTrials, Math.min(1, weight / remainingMass))
    counts[i] = count
    remainingTrials -= count
    remainingMass -= weight
  }
  counts[lastPositive] = remainingTrials
  return counts
}
