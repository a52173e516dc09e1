import { logRetentionPerGeneration, requireEffectiveSize } from './effective-size-domain'

/**
 * Half-life of heterozygosity under drift: the number of generations after
 * which half of the starting heterozygosity is expected to remain.
 *
 * Why: a single, intuitive figure for "how fast is this population losing
 * diversity" that can be shown next to Ne.
 *
 * Formula: t½ = ln(½) / ln(1 − 1/(2·Ne)) ≈ 1.386·Ne for large Ne
 * (SCIENCE.md §4.1). The denominator uses log1p for precision at large Ne.
 * Assumptions: as for `heterozygosityRetained` (ideal population, constant Ne).
 * Reference: Wright, S. (1931). Evolution in Mendelian populations.
 *   Genetics 16: 97–159.
 *
 * @param effectiveSize - Ne, individuals per generation, finite ≥ ½
 * @returns t½ in generations (real), > 0; 0 at Ne = ½ (all heterozygosity is
 *   lost in the first generation)
 * @throws RangeError if effectiveSize is outside its domain
 * @example heterozygosityHalfLife({ effectiveSize: 10 })   // 13.513407333964885
 * @example heterozygosityHalfLife({ effectiveSize: 100 })  // 138.28257298606096
 * @example heterozygosityHalfLife({ effectiveSize: 0.5 })  // 0
 */
export function heterozygosityHalfLife({ effectiveSize }: { effectiveSize: number }): number {
  requireEffectiveSize('heterozygosityHalfLife', 'effectiveSize', effectiveSize)
  // ln(½) / −Infinity = −0 at Ne = ½; adding 0 normalises it to +0.
  return -Math.LN2 / logRetentionPerGeneration(effectiveSize) + 0
}
