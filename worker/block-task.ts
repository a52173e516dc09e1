/**
 * The work of one pool thread: one block of replicates of one run, straight from the engine.
 * Replicate r always uses the random stream of (seed, r), so blocks merged in order give the
 * single-thread result whatever the number of threads or blocks.
 */
import { runEstablishmentReplicates, runRescueReplicates } from '../shared/genetics/simulate'
import type { EstablishmentParams, EstablishmentPartial, RescueParams, RescuePartial } from '../shared/genetics/simulate'
import type { SimulationModel } from '../shared/schemas/simulation-run'

/** One block: the run's model, parameters and seed, and which replicates. */
export interface BlockTask {
  model: SimulationModel
  parameters: unknown
  seed: number
  firstReplicate: number
  replicates: number
}

/** The block's mergeable partial result (plain data, structured-cloned back to the main thread). */
export type BlockPartial = EstablishmentPartial | RescuePartial

/**
 * Simulates one block.
 *
 * @param task - see BlockTask
 * @returns the engine's partial result of the block
 * @throws RangeError from the engine when a parameter is outside its domain
 */
export default function runBlock(task: BlockTask): BlockPartial {
  const block = { seed: task.seed, firstReplicate: task.firstReplicate, replicates: task.replicates }
  return task.model === 'establishment'
    ? runEstablishmentReplicates(task.parameters as EstablishmentParams, block)
    : runRescueReplicates(task.parameters as RescueParams, block)
}
