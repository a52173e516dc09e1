import { domainError, requireInRange, requireNonNegative } from '../validate'
import { requireEffectiveSize } from './effective-size-domain'
import { inbreedingAtGeneration, islandModelSolution } from './island-model-solution'

/**
 * Expected inbreeding coefficient after t generations of drift, optionally
 * with a constant fraction of immigrant genes each generation.
 *
 * Why: the core projection of "what happens to F with and without gene flow"
 * for a recipient subpopulation (SCIENCE.md §4.1, §4.2, §6.2).
 *
 * Formula (SCIENCE.md eq. 4.2, Wright's island model; m enters as (1 − m)²
 * outside the bracket, i.e. immigrant genes are unrelated to everything):
 *     F_t = (1 − m)²·[ 1/(2Ne) + (1 − 1/(2Ne))·F_(t−1) ]
 * With m = 0 this is Wright's closed form (eq. 4.1)
 *     1 − F_t = (1 − F_0)·(1 − 1/(2Ne))ᵗ,
 * valid for any real t ≥ 0. With m > 0 SCIENCE.md gives only the recurrence,
 * so t must be a whole number of generations. The value is computed from the
 * exact solution of the recurrence, F_t = F̂·(1 − bᵗ) + F_0·bᵗ with
 * b = (1 − m)²(1 − 1/(2Ne)) and F̂ the equilibrium, in O(1) and without error
 * growth in t. One generation with m > 0 gives the next-generation F of a
 * population receiving immigrant breeders (SCIENCE.md §6.2).
 * Assumptions: ideal population apart from its size; constant Ne and m; the
 * source is large and unrelated to the recipient (kinship 0 to the base);
 * m is the fraction of breeding genes contributed by immigrants (not the
 * fraction of animals moved); neutral loci. F is the expected pedigree
 * inbreeding relative to the founding generation, not F_IS from genotypes.
 * References: Wright, S. (1931). Evolution in Mendelian populations.
 *   Genetics 16: 97–159.
 *
 * @param effectiveSize - Ne, individuals per generation, finite ≥ ½
 * @param generations - t, generations, ≥ 0; real when migrationRate = 0,
 *   whole number when migrationRate > 0
 * @param initialInbreeding - F_0, in [0, 1]; default 0
 * @param migrationRate - m, fraction of genes per generation from immigrants,
 *   in [0, 1]; default 0
 * @returns F_t, in [0, 1]
 * @throws RangeError if an argument is outside its domain
 * @example inbreedingAfter({ effectiveSize: 50, generations: 10 })                           // 0.09561792499119552
 * @example inbreedingAfter({ effectiveSize: 20, generations: 10, initialInbreeding: 0.25 })   // 0.41775278435767166
 * @example inbreedingAfter({ effectiveSize: 50, generations: 10, migrationRate: 0.01 })       // 0.08589598466117179
 * @example inbreedingAfter({ effectiveSize: 20, generations: 1, initialInbreeding: 0.25, migrationRate: 0.1 })  // 0.21768749999999998 (exactly 0.2176875)
 * @example inbreedingAfter({ effectiveSize: 50, generations: 0, initialInbreeding: 0.3 })     // 0.3
 * @example inbreedingAfter({ effectiveSize: 50, generations: 3, migrationRate: 1 })           // 0
 */
export function inbreedingAfter({ effectiveSize, generations, initialInbreeding = 0, migrationRate = 0 }: {
  effectiveSize: number
  generations: number
  initialInbreeding?: number
  migrationRate?: number
}): number {
  const fn = 'inbreedingAfter'
  requireEffectiveSize(fn, 'effectiveSize', effectiveSize)
  requireInRange(fn, 'initialInbreeding', initialInbreeding, 0, 1)
  requireInRange(fn, 'migrationRate', migrationRate, 0, 1)
  requireNonNegative(fn, 'generations', generations)
  if (migrationRate > 0 && !Number.isInteger(generations)) {
    domainError(fn, 'generations', 'a whole number when migrationRate > 0', generations)
  }
  return inbreedingAtGeneration(islandModelSolution(effectiveSize, migrationRate), initialInbreeding, generations)
}
