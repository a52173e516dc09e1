import type { Schedule } from '../schedule'

/** One population (recipient or source) of the individual-based model. */
export interface RescuePopulationParams {
  /** Census N of breeding adults in each generation of the translocation phase, integer ≥ 2 (constant or per generation; entry t = generation t). */
  census: Schedule
  /** Target Ne/N, in (0, 1]; default 1. Realised through variance in family size (see `simulateRescue`). */
  effectiveRatio?: number
  /** Census during the burn-in, integer ≥ 2 (constant or per burn-in generation); default the phase's first census. */
  burnInCensus?: Schedule
  /** Length of the burn-in in generations, integer ≥ 0; default min(4·N, 200) with N the first burn-in census (see `burnIn`). */
  burnInGenerations?: number
}

/** Harmful mutations at a fixed set of load loci. */
export interface LoadParams {
  /** Number of load loci, integer in [1, 100 000]; default 2000. */
  loci?: number
  /** U, new harmful mutations per gamete (haploid genome) per generation, ≥ 0; default 0.5. */
  mutationRate?: number
  /** Mean selection coefficient s of a homozygous mutation, in (0, 1]; default 0.05. */
  meanSelection?: number
  /** Shape of the gamma distribution of s, > 0; default 0.3. */
  selectionShape?: number
  /** Mean dominance h over loci, in (0, 0.5]; default 0.2. h = exp(−k·s)/2 with k set to give this mean. */
  meanDominance?: number
}

/** The adaptive variant carried by source animals. */
export interface AdaptiveParams {
  /** s of AA in the recipient (fitnesses 1+s : 1+hs : 1), 1 + s > 0. */
  s: number
  /** h, dominance, 1 + hs > 0. */
  h: number
  /** Frequency of A in the source at the start of the translocation phase, in [0, 1]. */
  sourceFrequency: number
  /** Frequency of A in the recipient at the start, in [0, 1]; default 0. */
  recipientFrequency?: number
}

/** The translocation schedule. */
export interface TranslocationParams {
  /** Animals moved per event, integer ≥ 0. */
  migrantsPerEvent: number
  /** Generations between events, integer ≥ 1. */
  eventInterval: number
  /** Number of events, integer ≥ 0. */
  events: number
  /** Phase generation of the first event, integer ≥ 0; default 0. */
  firstEventGeneration?: number
  /** m, probability that each parent of each recipient offspring is an immigrant from the source, in [0, 1]; default 0. */
  migrationRate?: number
}

/** A genetic map: loci spread evenly over equal chromosomes. Without it every locus recombines freely. */
export interface LinkageMapParams {
  /** Number of chromosomes, integer ≥ 1. */
  chromosomes: number
  /** Length of each chromosome in Morgans (expected crossovers per meiosis), > 0. */
  chromosomeLength: number
}

/** Inputs of `simulateRescue`. Times are generations. */
export interface RescueParams {
  recipient: RescuePopulationParams
  source: RescuePopulationParams
  /** Generations of the translocation phase, integer in [1, 10 000]. */
  generations: number
  /** Neutral biallelic marker loci, integer in [1, 100 000]; default 200. */
  markerLoci?: number
  /** Harmful-mutation load; null for none; default the `LoadParams` defaults. */
  load?: LoadParams | null
  /** Adaptive variant; null or absent for none. */
  adaptive?: AdaptiveParams | null
  translocation: TranslocationParams
  /** Genetic map; absent for free recombination. */
  map?: LinkageMapParams
}

/** Run options of `simulateRescue`. */
export interface RescueOptions {
  /** Seed, integer (low 32 bits used). */
  seed: number
  /** Number of replicates, integer ≥ 1. */
  replicates: number
  /** Called after each replicate with (replicates done, replicates to do). */
  onProgress?: (completed: number, total: number) => void
}

/** Names of the per-generation quantities recorded in each arm. */
export const RESCUE_METRICS = [
  'census', 'heterozygosity', 'markerInbreeding', 'pedigreeInbreeding', 'meanFitness',
  'inbreedingLoad', 'driftLoad', 'fixedHarmful', 'adaptiveFrequency',
] as const

/** One recorded quantity. */
export type RescueMetric = typeof RESCUE_METRICS[number]

/** Mean and quantile bands of a quantity over replicates, generation by generation (null where no replicate has a value). */
export interface Bands {
  mean: (number | null)[]
  q05: (number | null)[]
  q25: (number | null)[]
  q50: (number | null)[]
  q75: (number | null)[]
  q95: (number | null)[]
}

/** Bands of every recorded quantity for one arm (with or without translocation). */
export type ArmSummary = Record<RescueMetric, Bands>

/** Summary of a run of `simulateRescue`. */
export interface RescueResult {
  replicates: number
  /** Phase generations 0…G (0 = end of burn-in, before any event). */
  generation: number[]
  withTranslocation: ArmSummary
  withoutTranslocation: ArmSummary
  /** Per-replicate ratio of mean fitness with / without translocation, in bands. */
  rescueEffect: Bands
  /** Replicates in which the recipient could no longer breed, by arm. */
  extinct: { withTranslocation: number, withoutTranslocation: number }
}

/** Mergeable raw outcome of a block of replicates. */
export interface RescuePartial {
  firstReplicate: number
  replicates: number
  generations: number
  /** Per metric, values replicate-major: entry r·(G + 1) + t; NaN after extinction. */
  withTranslocation: Record<RescueMetric, number[]>
  withoutTranslocation: Record<RescueMetric, number[]>
}
