import { domainError, requireNonNegative } from '../validate'

/**
 * Effective size with separate sexes in equal numbers and sex-specific
 * variance in lifetime family size.
 *
 * Why: in many mammals male breeding success varies far more than female
 * success; this form lets the two variances differ (SCIENCE.md §5).
 *
 * Formula: Ne = (8N − 4) / (Vk,m + Vk,f + 4). With Vk,m = Vk,f = Vk it equals
 * (4N − 2)/(Vk + 2), the single-variance form.
 * Assumptions: N/2 breeding adults of each sex, stable size, discrete
 * generations, variances of offspring reaching breeding age.
 * Reference: Hill, W. G. (1979). A note on effective population size with
 *   overlapping generations. Genetics 92: 317–322 [memory — verify before
 *   quoting; SCIENCE.md §5 marks this formula so].
 *
 * @param census - N, breeding adults of both sexes together, individuals, finite ≥ 1
 * @param maleFamilySizeVariance - Vk,m, offspring², finite ≥ 0
 * @param femaleFamilySizeVariance - Vk,f, offspring², finite ≥ 0
 * @returns Ne, individuals per generation, > 0
 * @throws RangeError if an argument is outside its domain
 * @example effectiveSizeFromSexFamilyVariance({ census: 40, maleFamilySizeVariance: 2, femaleFamilySizeVariance: 2 })  // 39.5
 * @example effectiveSizeFromSexFamilyVariance({ census: 40, maleFamilySizeVariance: 8, femaleFamilySizeVariance: 2 })  // 22.571428571428573
 */
export function effectiveSizeFromSexFamilyVariance({ census, maleFamilySizeVariance, femaleFamilySizeVariance }: {
  census: number
  maleFamilySizeVariance: number
  femaleFamilySizeVariance: number
}): number {
  const fn = 'effectiveSizeFromSexFamilyVariance'
  if (typeof census !== 'number' || !Number.isFinite(census) || census < 1) domainError(fn, 'census', 'a finite number ≥ 1', census)
  requireNonNegative(fn, 'maleFamilySizeVariance', maleFamilySizeVariance)
  requireNonNegative(fn, 'femaleFamilySizeVariance', femaleFamilySizeVariance)
  return (8 * census - 4) / (maleFamilySizeVariance + femaleFamilySizeVariance + 4)
}
