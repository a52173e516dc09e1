/**
 * Establishment (fixation) of an introduced allele (SCIENCE.md §1, §3):
 * Kimura's diffusion fixation probability and its log, Kimura & Ohta's
 * conditional fixation time, the labelled approximations (Haldane's 2hs with
 * the Ne/N factor, the branching-process survival value) and the validity
 * warnings. Re-exported from shared/genetics/index.ts.
 */
export type { FixationInputs, SelectionInputs } from './fixation-inputs'
export { MAXIMUM_SELECTION_STRENGTH } from './fixation-inputs'
export { fixationProbability, log10FixationProbability } from './fixation-probability'
export { conditionalFixationTime } from './conditional-fixation-time'
export { haldaneApproximation } from './haldane-approximation'
export type { HaldaneApproximation } from './haldane-approximation'
export { branchingSurvivalProbability } from './branching-survival-probability'
export { fixationMethodWarnings } from './fixation-method-warnings'
