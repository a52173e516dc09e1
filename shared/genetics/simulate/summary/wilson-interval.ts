import { requireInteger } from '../../validate'

/** Two-sided 95 % standard-normal quantile, Φ⁻¹(0.975). */
export const NORMAL_QUANTILE_975 = 1.959963984540054

/**
 * Wilson score confidence interval for a binomial proportion.
 *
 * Why: the establishment probability is a proportion of replicates; the
 * Wilson interval keeps sensible coverage near 0 and 1 and never leaves
 * [0, 1], unlike p̂ ± z·√(p̂(1−p̂)/n).
 *
 * Formula: centre (p̂ + z²/(2n)) / (1 + z²/n), half-width
 * z·√(p̂(1−p̂)/n + z²/(4n²)) / (1 + z²/n).
 * Reference: Wilson, E. B. (1927). Probable inference, the law of succession,
 *   and statistical inference. JASA 22: 209–212.
 *
 * @param successes - integer in [0, trials]
 * @param trials - integer ≥ 1
 * @param z - normal quantile, > 0; default 1.96 (95 %)
 * @returns [low, high] with 0 ≤ low ≤ p̂ ≤ high ≤ 1
 * @throws RangeError if counts are not integers in their domain
 * @example wilsonInterval(0, 100)  // [0, 0.0369934…]
 * @example wilsonInterval(50, 100) // [0.4038315…, 0.5961684…]
 * @example wilsonInterval(100, 100) // [0.9630065…, 1]
 */
export function wilsonInterval(successes: number, trials: number, z = NORMAL_QUANTILE_975): [number, number] {
  requireInteger('wilsonInterval', 'trials', trials, 1)
  requireInteger('wilsonInterval', 'successes', successes, 0)
  if (successes > trials) throw new RangeError(`wilsonInterval: successes must be ≤ trials (${trials}), got ${successes}`)
  const proportion = successes / trials
  const zSquareOverN = z * z / trials
  const centre = (proportion + zSquareOverN / 2) / (1 + zSquareOverN)
  const halfWidth = z * Math.sqrt(proportion * (1 - proportion) / trials + zSquareOverN / (4 * trials)) / (1 + zSquareOverN)
  // The bounds are exactly 0 and 1 at the extremes; rounding would leave ~10⁻¹⁸.
  return [successes === 0 ? 0 : Math.max(0, centre - halfWidth), successes === trials ? 1 : Math.min(1, centre + halfWidth)]
}
