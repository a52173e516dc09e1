import { requirePositive } from '../validate'

/**
 * Default Ne/N ratio for when only census counts are available, with the
 * range to offer the user (SCIENCE.md §5).
 *
 * - value 0.1: Frankham (1995) found that comprehensive estimates (including
 *   fluctuation in size, family-size variance and sex ratio) averaged only
 *   0.10–0.11, from 192 estimates in 102 species [paper: abstract].
 * - low 0.05 / high 0.3: the user-editable range suggested in SCIENCE.md §5
 *   as an engine default; it is a product choice, not a published interval.
 * - Palstra & Ruzzante (2008) report a median Ne/N of order 0.1–0.2 (≈ 0.14)
 *   [memory — verify]; highly fecund species (many marine fish) can have
 *   N/Ne ≥ 1000.
 */
export const NE_TO_CENSUS_RATIO_DEFAULT = {
  value: 0.1,
  low: 0.05,
  high: 0.3,
  source: 'Frankham R (1995) Effective population size/adult population size ratios in wildlife: a review. Genetical Research 66:95–107 [abstract: comprehensive estimates averaged 0.10–0.11]',
  rangeSource: 'Product default range suggested in SCIENCE.md §5 (not a published interval)',
} as const

/**
 * Effective size from a census count and an assumed Ne/N ratio.
 *
 * Why: most subpopulation records have census counts only; Ne = ratio·N
 * (default 0.1, `NE_TO_CENSUS_RATIO_DEFAULT`) is the usual stand-in, shown
 * as an assumption.
 *
 * Formula: Ne = (Ne/N)·N.
 * Assumptions: the ratio summarises fluctuation in size, family-size variance
 * and sex ratio for the species; it is a rough prior, not an estimate for
 * this population. Ratios above 1 are accepted (equalised family sizes can
 * give Ne up to ≈ 2N) — see `effectiveSizeCautions`.
 * Reference: Frankham, R. (1995). Genetical Research 66: 95–107.
 *
 * @param census - N, adults, individuals, finite > 0
 * @param ratio - Ne/N, finite > 0 (typical 0.05–0.3; default 0.1)
 * @returns Ne, individuals per generation, > 0
 * @throws RangeError if an argument is outside its domain
 * @example effectiveSizeFromRatio({ census: 500 })               // 50
 * @example effectiveSizeFromRatio({ census: 500, ratio: 0.3 })   // 150
 */
export function effectiveSizeFromRatio({ census, ratio = NE_TO_CENSUS_RATIO_DEFAULT.value }: {
  census: number
  ratio?: number
}): number {
  requirePositive('effectiveSizeFromRatio', 'census', census)
  requirePositive('effectiveSizeFromRatio', 'ratio', ratio)
  return ratio * census
}
