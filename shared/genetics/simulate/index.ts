/**
 * Stochastic forward simulations (issue 4): the one-locus allele-frequency
 * model of establishment and the individual-based model of genetic rescue,
 * with seeded random streams and worker-pool helpers. Re-exported from
 * shared/genetics/index.ts.
 */
export * from './establishment'
export * from './rescue'
export * from './random'
export * from './summary'
export { splitReplicates, orderedBlocks } from './replicate-ranges'
export type { ReplicateRange } from './replicate-ranges'
export { expandSchedule } from './schedule'
export type { Schedule } from './schedule'
