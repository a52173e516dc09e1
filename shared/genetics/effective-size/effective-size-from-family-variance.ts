import { domainError, requireNonNegative } from '../validate'

/**
 * Effective size from the variance in lifetime family size.
 *
 * Why: unequal breeding success (a few parents leave most offspring) lowers
 * Ne below N; managed equalisation of family sizes (Vk < 2) raises it towards
 * 2N (SCIENCE.md §5).
 *
 * Formula: Ne = (4N − 2) / (Vk + 2). Vk = 2 (Poisson) gives Ne ≈ N; Vk = 0
 * gives Ne ≈ 2N.
 * Assumptions: stable population size (mean family size k̄ = 2), N breeding
 * adults, discrete generations, Vk = variance among parents in the number of
 * offspring reaching breeding age (lifetime reproductive success for species
 * with overlapping generations; the result is then Ne per generation).
 * Reference: Wright (1938); Crow, J. F., Kimura, M. (1970). An Introduction
 *   to Population Genetics Theory. Harper & Row; general treatment Crow, J. F.,
 *   Denniston, C. (1988). Evolution 42: 482–495 [memory, SCIENCE.md §5].
 *
 * @param census - N, breeding adults, individuals, finite ≥ 1
 * @param familySizeVariance - Vk, offspring², finite ≥ 0
 * @returns Ne, individuals per generation, > 0 (may exceed N when Vk < 2)
 * @throws RangeError if an argument is outside its domain
 * @example effectiveSizeFromFamilyVariance({ census: 50, familySizeVariance: 6 })  // 24.75
 * @example effectiveSizeFromFamilyVariance({ census: 50, familySizeVariance: 2 })  // 49.5
 * @example effectiveSizeFromFamilyVariance({ census: 20, familySizeVariance: 0 })  // 39
 */
export function effectiveSizeFromFamilyVariance({ census, familySizeVariance }: {
  census: number
  familySizeVariance: number
}): number {
  const fn = 'effectiveSizeFromFamilyVariance'
  if (typeof census !== 'number' || !Number.isFinite(census) || census < 1) domainError(fn, 'census', 'a finite number ≥ 1', census)
  requireNonNegative(fn, 'familySizeVariance', familySizeVariance)
  return (4 * census - 2) / (familySizeVariance + 2)
}
