/**
 * Seeded random streams and the samplers the stochastic simulations need.
 * Every function takes the generator as a parameter; nothing here reads a
 * global random source or the clock.
 */
export { replicateStream, sharedStream, spawnStream, ReplicateStreams } from './streams'
export type { RandomStream } from './streams'
export { uniform01, uniform32, uniformIndex } from './uniform'
export { sampleBinomial, binomialDraw, binomialSetup, binomialWithSetup, binomialInversionTable, binomialInversionFromTable, BINOMIAL_SETUP_SIZE, BINOMIAL_INVERSION_LIMIT } from './binomial'
export { samplePoisson, POISSON_MULTIPLICATION_LIMIT } from './poisson'
export { sampleStandardNormal } from './normal'
export { sampleGamma } from './gamma'
export { sampleMultinomial } from './multinomial'
export { logFactorial } from './log-factorial'
export { WeightedSampler } from './weighted-sampler'
