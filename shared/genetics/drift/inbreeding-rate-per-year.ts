import { requirePositive } from '../validate'
import { logRetentionPerGeneration, requireEffectiveSize } from './effective-size-domain'

/**
 * Expected increase in inbreeding per year in an isolated population.
 *
 * Why: a per-year rate lets long-lived and short-lived species be compared
 * on the calendar managers use (SCIENCE.md §10).
 *
 * Formula: ΔF per year = 1 − (1 − 1/(2Ne))^(1/L) ≈ 1/(2·Ne·L), evaluated as
 * −expm1(log1p(−1/(2Ne)) / L) so that small rates keep full precision. This
 * is the fraction of the remaining non-inbred share (1 − F) lost per year.
 * Assumptions: ideal population, constant Ne per generation and generation
 * length L, no immigration (SCIENCE.md §4.1, §10).
 * Reference: Wright, S. (1931). Genetics 16: 97–159; SCIENCE.md §10.
 *
 * @param effectiveSize - Ne, individuals per generation, finite ≥ ½
 * @param generationTime - L, years per generation, finite > 0
 * @returns ΔF per year, in [0, 1]; equals 1/(2Ne) at L = 1
 * @throws RangeError if an argument is outside its domain
 * @example inbreedingRatePerYear({ effectiveSize: 50, generationTime: 1 })  // 0.01
 * @example inbreedingRatePerYear({ effectiveSize: 50, generationTime: 8 })  // 0.0012555031772735197
 * @example inbreedingRatePerYear({ effectiveSize: 0.5, generationTime: 4 }) // 1
 */
export function inbreedingRatePerYear({ effectiveSize, generationTime }: {
  effectiveSize: number
  generationTime: number
}): number {
  const fn = 'inbreedingRatePerYear'
  requireEffectiveSize(fn, 'effectiveSize', effectiveSize)
  requirePositive(fn, 'generationTime', generationTime)
  return -Math.expm1(logRetentionPerGeneration(effectiveSize) / generationTime)
}
