import { domainError, requirePositive } from '../validate'

/**
 * Effective size over several generations of changing size: the harmonic
 * mean of the per-generation effective sizes.
 *
 * Why: a population's long-run Ne is dominated by its smallest generations
 * (bottlenecks); the arithmetic mean of a census series overstates it
 * (SCIENCE.md §5: (100, 10, 100, 100) → 30.77, arithmetic 77.5).
 *
 * Formula: 1/Ne = (1/t)·Σᵢ 1/Nᵢ, i.e. Ne = t / Σᵢ (1/Nᵢ).
 * Assumptions: each Nᵢ is already that generation's effective size (combine
 * sex ratio and family-size variance within a generation first); one value
 * per generation; the identity is the usual approximation to the product
 * Π(1 − 1/(2Nᵢ)) (see `heterozygosityRetainedVaryingSize` for the exact one).
 * Reference: Wright, S. (1938). Size of population and breeding structure in
 *   relation to evolution. Science 87: 430–431 [memory, SCIENCE.md §5].
 *
 * @param sizes - per-generation effective sizes, individuals, each finite > 0;
 *   at least one value
 * @returns harmonic-mean Ne, individuals per generation, in [min, max] of the sizes
 * @throws RangeError if the list is empty or a size is outside its domain
 * @example effectiveSizeHarmonicMean([100, 10, 100, 100])  // 30.769230769230766
 * @example effectiveSizeHarmonicMean([1000, 20, 1000])     // 57.692307692307686
 * @example effectiveSizeHarmonicMean([42])                 // 42
 */
export function effectiveSizeHarmonicMean(sizes: readonly number[]): number {
  const fn = 'effectiveSizeHarmonicMean'
  if (!Array.isArray(sizes) || sizes.length === 0) domainError(fn, 'sizes', 'a non-empty array of numbers', Array.isArray(sizes) ? '[]' : sizes)
  let reciprocalSum = 0
  for (const size of sizes) {
    requirePositive(fn, 'sizes[i]', size)
    reciprocalSum += 1 / size
  }
  return sizes.length / reciprocalSum
}
