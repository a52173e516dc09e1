import type { Schedule } from '../schedule'
import type { Quantiles } from '../summary/quantiles'

/**
 * Inputs of the one-locus allele-frequency simulation (see
 * `simulateEstablishment` for the model). Times are in generations.
 */
export interface EstablishmentParams {
  /** N, recipient census of breeding adults, integer ≥ 1, constant or per generation. */
  census: Schedule
  /** Ne, recipient effective size, > 0, constant or per generation. */
  effectiveSize: Schedule
  /** s, selection coefficient of the AA homozygote (fitnesses 1+s : 1+hs : 1); 1 + s > 0. */
  s: number
  /** h, dominance of A; 1 + h·s > 0. */
  h: number
  /** q, frequency of A in the source, in [0, 1]; required unless `introducedCopies` is given. */
  sourceFrequency?: number
  /** Exact number of A copies brought by each event, integer ≥ 0; replaces drawing from `sourceFrequency`. */
  introducedCopies?: number
  /** k, animals moved per event, integer ≥ 0 (0 only with `introducedCopies`). */
  migrantsPerEvent: number
  /** Generations between events, integer ≥ 1. */
  eventInterval: number
  /** Number of translocation events, integer ≥ 0. */
  events: number
  /** m, continuing migration rate from the source per generation, in [0, 1]; default 0. */
  migrationRate?: number
  /** Horizon: number of generations simulated, integer ≥ 1. */
  generations: number
  /** Generation of the first event, integer ≥ 0; default 0. Times are measured from it. */
  firstEventGeneration?: number
}

/** How many replicates to run, and with which seed. */
export interface EstablishmentOptions {
  /** Seed of the random streams, integer (low 32 bits used). */
  seed: number
  /** Number of replicates, integer ≥ 1. */
  replicates: number
  /** Called now and then with (replicates done, replicates to do). */
  onProgress?: (completed: number, total: number) => void
}

/** Per-generation quantiles of the recipient's A frequency over replicates. */
export interface TrajectoryQuantiles {
  /** Generations at which quantiles are given (every generation up to 200, else 201 evenly spaced). */
  generation: number[]
  q05: number[]
  q25: number[]
  q50: number[]
  q75: number[]
  q95: number[]
}

/** Summary of a run of `simulateEstablishment`. */
export interface EstablishmentResult {
  replicates: number
  /** Replicates in which A reached fixation within the horizon. */
  established: number
  /** Replicates in which A was lost with no further input possible. */
  lost: number
  /** Replicates still segregating (or awaiting input) at the horizon. */
  unresolved: number
  /** established / replicates. */
  probability: number
  /** Wilson score 95 % interval for `probability`. */
  interval95: [number, number]
  /** Mean generations from the first event to fixation, over established replicates; null if none. */
  meanTimeToEstablishment: number | null
  /** Quantiles of generations from the first event to fixation. */
  timeToEstablishment: Quantiles
  /** Quantiles of generations from the first event to loss. */
  timeToLoss: Quantiles
  /** Bands of the A frequency, generation by generation. */
  trajectoryQuantiles: TrajectoryQuantiles
}

/**
 * Mergeable raw outcome of a block of replicates, for worker pools. Plain
 * arrays only, so it survives structured cloning and JSON.
 */
export interface EstablishmentPartial {
  /** Index of the block's first replicate. */
  firstReplicate: number
  replicates: number
  established: number
  lost: number
  unresolved: number
  /** Times to fixation (generations from the first event), in replicate order. */
  establishmentTimes: number[]
  /** Times to loss, in replicate order. */
  lossTimes: number[]
  /** Generations of the trajectory grid. */
  trajectoryGenerations: number[]
  /**
   * Histogram of A frequency at each grid generation, row-major
   * [grid point][bin], bins of width 1/TRAJECTORY_BINS (value rounded to the
   * nearest bin).
   */
  trajectoryCounts: number[]
}
