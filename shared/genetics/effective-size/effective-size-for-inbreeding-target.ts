import { domainError, requirePositive } from '../validate'

/**
 * Smallest constant effective size that keeps expected inbreeding at or
 * below a target over a horizon (isolated population, starting at F = 0).
 *
 * Why: turns a management goal ("F ≤ 0.1 over 10 generations") into a
 * population-size target; also the arithmetic behind the revised 100/1000
 * rules (SCIENCE.md §6.4).
 *
 * Formula: solving (1 − 1/(2Ne))ᵗ = 1 − F* for Ne:
 *     Ne = 1 / (2·[1 − (1 − F*)^(1/t)]),
 * evaluated as 1 / (−2·expm1(log1p(−F*) / t)) so that small targets and long
 * horizons keep full precision. Because F_t increases as Ne falls, any
 * Ne ≥ this value keeps F_t ≤ F*.
 * Assumptions: ideal isolated population, constant Ne, F_0 = 0
 * (SCIENCE.md §4.1, §6.4). The result is real; round up for a head count.
 * Reference: Wright, S. (1931). Genetics 16: 97–159 (the formula inverted);
 *   SCIENCE.md §6.4 check values.
 *
 * @param maxInbreeding - F*, the highest acceptable F at the horizon, in (0, 1)
 * @param generations - t, horizon in generations (real), finite > 0
 * @returns Ne, individuals per generation, ≥ ½
 * @throws RangeError if an argument is outside its domain
 * @example effectiveSizeForInbreedingTarget({ maxInbreeding: 0.1, generations: 10 })    // 47.706546906485876
 * @example effectiveSizeForInbreedingTarget({ maxInbreeding: 0.1, generations: 100 })   // 474.8111229517092
 * @example effectiveSizeForInbreedingTarget({ maxInbreeding: 0.5, generations: 1 })     // 1
 */
export function effectiveSizeForInbreedingTarget({ maxInbreeding, generations }: {
  maxInbreeding: number
  generations: number
}): number {
  const fn = 'effectiveSizeForInbreedingTarget'
  if (typeof maxInbreeding !== 'number' || !Number.isFinite(maxInbreeding) || maxInbreeding <= 0 || maxInbreeding >= 1) {
    domainError(fn, 'maxInbreeding', 'in (0, 1)', maxInbreeding)
  }
  requirePositive(fn, 'generations', generations)
  const lossPerGeneration = -Math.expm1(Math.log1p(-maxInbreeding) / generations)
  return 1 / (2 * lossPerGeneration)
}
