/**
 * Inbreeding depression, drift load and the expected benefit of gene flow
 * (SCIENCE.md §6.1–6.3): lethal-equivalent data and defaults, relative
 * fitness, rescue fitness ratio, F2 inbreeding of crosses and published
 * rescue effect sizes. Re-exported from shared/genetics/index.ts.
 */
export {
  CAPTIVE_MAMMAL_LETHAL_EQUIVALENT_RANGE,
  DEFAULT_DIPLOID_LETHAL_EQUIVALENTS,
  PUBLISHED_LETHAL_EQUIVALENTS,
} from './lethal-equivalents'
export type { LethalEquivalentEstimate } from './lethal-equivalents'
export { relativeFitness } from './relative-fitness'
export { fitnessReductionFromInbreeding } from './fitness-reduction-from-inbreeding'
export { rescueFitnessRatio } from './rescue-fitness-ratio'
export { diploidLethalEquivalentsFromFitness } from './lethal-equivalents-from-fitness'
export { secondGenerationCrossInbreeding } from './cross-inbreeding'
export { GENETIC_RESCUE_META_ANALYSES } from './published-rescue-effects'
