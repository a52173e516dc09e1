import { requirePositive } from '../validate'

/** A caution to show next to an effective size; `code` is stable, `message` is plain words. */
export interface EffectiveSizeCaution {
  readonly code: 'very-small' | 'above-twice-census'
  readonly message: string
}

/** Below this Ne the diffusion and Ne formulas are only indicative (SCIENCE.md §10). */
export const VERY_SMALL_EFFECTIVE_SIZE = 10

/**
 * Cautions to show with an effective size (SCIENCE.md §5, §10 flag table).
 *
 * Why: the formulas accept any positive Ne, but two situations deserve a
 * visible warning: very small Ne, where the smooth formulas are only
 * indicative, and Ne above twice the census, which is implausible unless
 * family sizes are actively equalised.
 *
 * Rules: Ne < 10 → 'very-small'; census given and Ne > 2N → 'above-twice-census'.
 * Reference: SCIENCE.md §5 (Ne up to ≈ 2N with equalised families) and §10;
 *   the thresholds are common practice, not from a paper.
 *
 * @param effectiveSize - Ne, individuals per generation, finite > 0
 * @param census - N, breeding adults, finite > 0; optional
 * @returns a new array of cautions, empty when none applies
 * @throws RangeError if an argument is outside its domain
 * @example effectiveSizeCautions({ effectiveSize: 50, census: 200 })  // []
 * @example effectiveSizeCautions({ effectiveSize: 6 })                // [{ code: 'very-small', … }]
 * @example effectiveSizeCautions({ effectiveSize: 90, census: 40 })   // [{ code: 'above-twice-census', … }]
 */
export function effectiveSizeCautions({ effectiveSize, census }: {
  effectiveSize: number
  census?: number
}): EffectiveSizeCaution[] {
  const fn = 'effectiveSizeCautions'
  requirePositive(fn, 'effectiveSize', effectiveSize)
  if (census !== undefined) requirePositive(fn, 'census', census)
  const cautions: EffectiveSizeCaution[] = []
  if (effectiveSize < VERY_SMALL_EFFECTIVE_SIZE) {
    cautions.push({
      code: 'very-small',
      message: 'Very small effective size: the smooth formulas are only indicative here; prefer the exact model and treat results as a guide.',
    })
  }
  if (census !== undefined && effectiveSize > 2 * census) {
    cautions.push({
      code: 'above-twice-census',
      message: 'Effective size is more than twice the census count, which is implausible unless family sizes are actively equalised.',
    })
  }
  return cautions
}
