/**
 * One-locus allele-frequency simulation of translocated adaptive variants:
 * the whole-run function and the block/merge/summary API for worker pools.
 */
export { simulateEstablishment } from './simulate-establishment'
export { runEstablishmentReplicates } from './run-establishment-replicates'
export type { ReplicateBlock } from './run-establishment-replicates'
export { mergeEstablishmentPartials } from './merge-establishment-partials'
export { summarizeEstablishment } from './summarize-establishment'
export { frequencyAfterSelection } from './selection-step'
export { trajectoryGrid, TRAJECTORY_BINS } from './trajectory-grid'
export { MAXIMUM_GENERATIONS } from './establishment-plan'
export type {
  EstablishmentParams, EstablishmentOptions, EstablishmentResult, EstablishmentPartial, TrajectoryQuantiles,
} from './types'
