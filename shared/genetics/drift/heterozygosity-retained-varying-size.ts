import { domainError } from '../validate'
import { logRetentionPerGeneration, requireEffectiveSize } from './effective-size-domain'

/**
 * Fraction of heterozygosity retained over a run of generations whose
 * effective sizes differ (e.g. a bottleneck followed by recovery).
 *
 * Why: census series are rarely constant; one small generation removes more
 * diversity than several large ones restore (SCIENCE.md §4.1, §5).
 *
 * Formula: H_t / H_0 = Π_i (1 − 1/(2·Ne,i)), summed in log space
 * (Σ log1p(−1/(2·Ne,i)), then exp) so long series do not lose precision.
 * Equivalent to `heterozygosityRetained` with Ne equal to the harmonic-mean
 * size only approximately; this product is the exact statement.
 * Assumptions: ideal population in each generation, no migration, mutation
 * or selection. Reference: Wright, S. (1931). Genetics 16: 97–159.
 *
 * @param effectiveSizes - Ne of each generation in turn, each finite ≥ ½;
 *   an empty list means no generations have passed
 * @returns H_t / H_0, in [0, 1]; 1 for an empty list
 * @throws RangeError if any size is outside its domain
 * @example heterozygosityRetainedVaryingSize({ effectiveSizes: [100, 10, 100, 100] })  // 0.93582113125
 * @example heterozygosityRetainedVaryingSize({ effectiveSizes: [] })                   // 1
 */
export function heterozygosityRetainedVaryingSize({ effectiveSizes }: {
  effectiveSizes: readonly number[]
}): number {
  const fn = 'heterozygosityRetainedVaryingSize'
  if (!Array.isArray(effectiveSizes)) domainError(fn, 'effectiveSizes', 'an array of numbers', effectiveSizes)
  let logRetained = 0
  for (const size of effectiveSizes) {
    requireEffectiveSize(fn, 'effectiveSizes[i]', size)
    logRetained += logRetentionPerGeneration(size)
  }
  return Math.exp(logRetained)
}
