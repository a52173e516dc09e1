/**
 * Individual-based simulation of genetic rescue (markers, pedigree, load,
 * adaptive variant; paired arms with and without translocation): the
 * whole-run function and the block/merge/summary API for worker pools.
 */
export { simulateRescue } from './simulate-rescue'
export { runRescueReplicates } from './run-rescue-replicates'
export type { RescueBlock } from './run-rescue-replicates'
export { mergeRescuePartials } from './merge-rescue-partials'
export { summarizeRescue } from './summarize-rescue'
export { dominanceRate, dominanceFromSelection } from './dominance'
export { reproductiveWeightShape } from './family-weights'
export { equilibriumFrequency } from './architecture'
export { DEFAULT_LOAD, DEFAULT_BURN_IN_CAP, MAXIMUM_RESCUE_GENERATIONS, MAXIMUM_LOCI } from './rescue-plan'
export { RESCUE_METRICS } from './types'
export type {
  RescueParams, RescueOptions, RescueResult, RescuePartial, RescuePopulationParams, LoadParams, AdaptiveParams,
  TranslocationParams, LinkageMapParams, Bands, ArmSummary, RescueMetric,
} from './types'
