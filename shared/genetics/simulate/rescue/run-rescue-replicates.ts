import { requireInteger } from '../../validate'
import { ReplicateStreams, sharedStream } from '../random/streams'
import { genomeArchitecture } from './architecture'
import { rescuePlan } from './rescue-plan'
import { runRescueReplicate } from './run-rescue-replicate'
import { RESCUE_METRICS } from './types'
import type { RescueMetric, RescueParams, RescuePartial } from './types'

/** Which replicates of a run to simulate, and with which seed. */
export interface RescueBlock {
  /** Seed of the whole run, integer (low 32 bits used). */
  seed: number
  /** Index of the first replicate of this block, integer ≥ 0. */
  firstReplicate: number
  /** Number of replicates in this block, integer ≥ 0. */
  replicates: number
  /** Called after each replicate with (replicates done in this block, block size). */
  onProgress?: (completed: number, total: number) => void
}

/**
 * Simulates one block of replicates of the individual-based model (see
 * `simulateRescue`) and returns its mergeable raw records. The genome
 * architecture comes from the seed's shared stream and replicate r from
 * `replicateStream(seed, r)`, so blocks merged with `mergeRescuePartials`
 * reproduce the single-block result exactly.
 *
 * @param params - model inputs
 * @param block - seed and replicate range
 * @returns the block's partial result
 * @throws RangeError if an input is outside its domain
 */
export function runRescueReplicates(params: RescueParams, block: RescueBlock): RescuePartial {
  return runRescueBlock('runRescueReplicates', params, block)
}

/**
 * `runRescueReplicates` with the caller's name in error messages.
 *
 * @param fn - public function name for RangeErrors
 * @param params - model inputs
 * @param block - seed and replicate range
 * @returns the block's partial result
 */
export function runRescueBlock(fn: string, params: RescueParams, block: RescueBlock): RescuePartial {
  requireInteger(fn, 'firstReplicate', block.firstReplicate, 0)
  requireInteger(fn, 'replicates', block.replicates, 0)
  if (typeof block.seed !== 'number' || !Number.isInteger(block.seed)) throw new RangeError(`${fn}: seed must be an integer, got ${String(block.seed)}`)
  const plan = rescuePlan(fn, params)
  const architecture = genomeArchitecture(plan, sharedStream(block.seed))
  const streams = new ReplicateStreams(block.seed, block.firstReplicate)
  const length = plan.generations + 1
  const withArm = emptyColumns(block.replicates * length)
  const withoutArm = emptyColumns(block.replicates * length)
  for (let replicate = 0; replicate < block.replicates; replicate++) {
    const record = runRescueReplicate(plan, architecture, streams.next())
    for (const metric of RESCUE_METRICS) {
      withArm[metric].set(record.withTranslocation[metric], replicate * length)
      withoutArm[metric].set(record.withoutTranslocation[metric], replicate * length)
    }
    block.onProgress?.(replicate + 1, block.replicates)
  }
  return {
    firstReplicate: block.firstReplicate,
    replicates: block.replicates,
    generations: plan.generations,
    withTranslocation: toArrays(withArm),
    withoutTranslocation: toArrays(withoutArm),
  }
}

function emptyColumns(length: number): Record<RescueMetric, Float64Array> {
  const columns = {} as Record<RescueMetric, Float64Array>
  for (const metric of RESCUE_METRICS) columns[metric] = new Float64Array(length)
  return columns
}

function toArrays(columns: Record<RescueMetric, Float64Array>): Record<RescueMetric, number[]> {
  const arrays = {} as Record<RescueMetric, number[]>
  for (const metric of RESCUE_METRICS) arrays[metric] = Array.from(columns[metric])
  return arrays
}
