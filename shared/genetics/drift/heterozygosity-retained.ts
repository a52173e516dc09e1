import { requireNonNegative } from '../validate'
import { logRetentionPerGeneration, requireEffectiveSize } from './effective-size-domain'

/**
 * Fraction of heterozygosity retained after t generations of genetic drift.
 *
 * Why: the basic measure of how fast a small isolated subpopulation loses
 * genetic diversity; 1 − H_t/H_0 is also the inbreeding accumulated from a
 * non-inbred start (SCIENCE.md §4.1).
 *
 * Formula: H_t / H_0 = (1 − 1/(2·Ne))ᵗ, evaluated as exp(t · log1p(−1/(2·Ne)))
 * so that large Ne and long horizons keep full relative precision.
 * Assumptions: ideal population apart from its size (Wright–Fisher random
 * mating), constant Ne, no selection on the marker, no migration or mutation.
 * The closed form is valid for any real t ≥ 0 (e.g. a horizon in years
 * converted to generations).
 * Reference: Wright, S. (1931). Evolution in Mendelian populations.
 *   Genetics 16: 97–159.
 *
 * @param effectiveSize - Ne, individuals per generation, finite ≥ ½
 * @param generations - t, generations (whole or fractional), finite ≥ 0
 * @returns H_t / H_0, in [0, 1]; 1 at t = 0; 0 when Ne = ½ and t > 0
 * @throws RangeError if an argument is outside its domain
 * @example heterozygosityRetained({ effectiveSize: 50, generations: 10 })  // 0.9043820750088045
 * @example heterozygosityRetained({ effectiveSize: 10, generations: 5 })   // 0.7737809375
 * @example heterozygosityRetained({ effectiveSize: 50, generations: 0 })   // 1
 * @example heterozygosityRetained({ effectiveSize: 0.5, generations: 1 })  // 0
 */
export function heterozygosityRetained({ effectiveSize, generations }: {
  effectiveSize: number
  generations: number
}): number {
  const fn = 'heterozygosityRetained'
  requireEffectiveSize(fn, 'effectiveSize', effectiveSize)
  requireNonNegative(fn, 'generations', generations)
  // t = 0 is handled first: 0 · ln(0) would be NaN when Ne = ½.
  if (generations === 0) return 1
  return Math.exp(generations * logRetentionPerGeneration(effectiveSize))
}
