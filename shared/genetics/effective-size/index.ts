/**
 * Effective population size from demography (SCIENCE.md §5, §6.4): sex
 * ratio, fluctuating size, family-size variance, Ne/N ratio, the Ne needed
 * for an inbreeding target, minimum-Ne rules of thumb and cautions.
 * Re-exported from shared/genetics/index.ts.
 */
export { effectiveSizeFromSexRatio } from './effective-size-from-sex-ratio'
export { effectiveSizeHarmonicMean } from './effective-size-harmonic-mean'
export { effectiveSizeFromFamilyVariance } from './effective-size-from-family-variance'
export { effectiveSizeFromSexFamilyVariance } from './effective-size-from-sex-family-variance'
export { effectiveSizeForInbreedingTarget } from './effective-size-for-inbreeding-target'
export { effectiveSizeFromRatio, NE_TO_CENSUS_RATIO_DEFAULT } from './effective-size-from-ratio'
export { MINIMUM_EFFECTIVE_SIZE_RULES, SHORT_TERM_RULE_GENERATIONS } from './minimum-size-rules'
export type { MinimumSizeRule } from './minimum-size-rules'
export { effectiveSizeCautions, VERY_SMALL_EFFECTIVE_SIZE } from './effective-size-cautions'
export type { EffectiveSizeCaution } from './effective-size-cautions'
