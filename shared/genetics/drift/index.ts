/**
 * Drift, inbreeding and migration (SCIENCE.md §4, §10): loss of
 * heterozygosity, rise of inbreeding with and without immigrants, the
 * island-model equilibrium and the one-migrant rule, and generation ↔ year
 * conversions. Re-exported from shared/genetics/index.ts.
 */
export { MINIMUM_EFFECTIVE_SIZE } from './effective-size-domain'
export { heterozygosityRetained } from './heterozygosity-retained'
export { heterozygosityRetainedVaryingSize } from './heterozygosity-retained-varying-size'
export { heterozygosityHalfLife } from './heterozygosity-half-life'
export { inbreedingAfter } from './inbreeding-after'
export { inbreedingTrajectory, MAXIMUM_TRAJECTORY_GENERATIONS } from './inbreeding-trajectory'
export { generationsToReachInbreeding } from './generations-to-reach-inbreeding'
export { equilibriumInbreeding } from './equilibrium-inbreeding'
export { equilibriumInbreedingApproximation } from './equilibrium-inbreeding-approximation'
export { migrantsPerGeneration, ONE_MIGRANT_PER_GENERATION_RULE } from './migrants-per-generation'
export { migrantsForEquilibriumInbreeding } from './migrants-for-equilibrium-inbreeding'
export { migrationRateForEquilibriumInbreeding } from './migration-rate-for-equilibrium-inbreeding'
export { generationsFromYears, yearsFromGenerations } from './generation-time'
export { inbreedingRatePerYear } from './inbreeding-rate-per-year'
