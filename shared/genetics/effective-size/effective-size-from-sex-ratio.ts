import { requirePositive } from '../validate'

/**
 * Effective size of a population with unequal numbers of breeding males and
 * females.
 *
 * Why: a skewed sex ratio (e.g. a few dominant males) is one of the main
 * reasons Ne falls below the census count (SCIENCE.md §5).
 *
 * Formula: Ne = 4·Nm·Nf / (Nm + Nf); equals Nm + Nf at a 1:1 ratio and is
 * always ≤ Nm + Nf (the two sides differ by (Nm − Nf)² / (Nm + Nf)).
 * Assumptions: random mating within each sex, Poisson family sizes,
 * discrete generations; numbers are breeding adults. Counts may be averages,
 * so non-integers are accepted.
 * Reference: Wright, S. (1931). Evolution in Mendelian populations.
 *   Genetics 16: 97–159 [attribution from memory, SCIENCE.md §5].
 *
 * @param males - Nm, breeding males, individuals, finite > 0
 * @param females - Nf, breeding females, individuals, finite > 0
 * @returns Ne, individuals per generation, in (0, Nm + Nf]
 * @throws RangeError if an argument is outside its domain
 * @example effectiveSizeFromSexRatio({ males: 10, females: 40 })  // 32
 * @example effectiveSizeFromSexRatio({ males: 1, females: 99 })   // 3.96
 * @example effectiveSizeFromSexRatio({ males: 25, females: 25 })  // 50
 */
export function effectiveSizeFromSexRatio({ males, females }: { males: number, females: number }): number {
  requirePositive('effectiveSizeFromSexRatio', 'males', males)
  requirePositive('effectiveSizeFromSexRatio', 'females', females)
  return (4 * males * females) / (males + females)
}
