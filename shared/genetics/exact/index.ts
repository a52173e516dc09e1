/**
 * The exact Wright–Fisher chain with selection (SCIENCE.md §2, §3.3): fixation
 * probabilities and conditional fixation times by subtraction-free state
 * reduction of the banded transition matrix. Re-exported from
 * shared/genetics/index.ts; the other files here are internal.
 */
export { MAXIMUM_EXACT_CENSUS, type ExactChainParameters } from './chain-inputs'
export { exactFixationProbabilities, exactFixationProbability } from './fixation-probabilities'
export { exactConditionalFixationTimes, exactConditionalFixationTime } from './conditional-fixation-time'
