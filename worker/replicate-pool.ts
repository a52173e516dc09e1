/**
 * A pool of worker threads (tinypool) that runs the replicates of one simulation run in blocks
 * and merges them into the engine's result.
 *
 * Same result whatever the number of threads: the replicates 0…R−1 are split into contiguous
 * blocks (`splitReplicates`), each block uses the per-replicate random streams of the engine,
 * and the engine's merge puts the blocks back in replicate order (`mergeEstablishmentPartials`
 * / `mergeRescuePartials`) before the summary — so 1 thread, 2 threads or 8 give identical
 * output for a given seed.
 *
 * Blocks: min(R, max(20, 4 × threads)) — enough for the threads to stay busy and for progress
 * to move in steps of at most 5 %; cancellation takes effect between blocks (queued blocks are
 * dropped and running ones stopped).
 */
import { setMaxListeners } from 'node:events'
import Tinypool from 'tinypool'
import {
  mergeEstablishmentPartials, mergeRescuePartials, splitReplicates, summarizeEstablishment, summarizeRescue,
} from '../shared/genetics/simulate'
import type { EstablishmentPartial, RescuePartial } from '../shared/genetics/simulate'
import type { SimulationModel, SimulationResult } from '../shared/schemas/simulation-run'
import type { BlockPartial, BlockTask } from './block-task'

/** What to run. */
export interface PoolRun {
  model: SimulationModel
  parameters: unknown
  seed: number
  replicates: number
}

/** How to run it. */
export interface PoolRunOptions {
  /** Called after each finished block with (replicates done, replicates in all). */
  onProgress?: (completed: number, total: number) => void
  /** Aborting stops the run: queued blocks are dropped, running ones stopped, and run() rejects. */
  signal?: AbortSignal
  /** Number of blocks (default: see the file comment). */
  blocks?: number
}

/** The default number of blocks for `replicates` on `threads` threads. */
export function blockCount(replicates: number, threads: number): number {
  return Math.max(1, Math.min(replicates, Math.max(20, 4 * threads)))
}

/** Thrown by `run` when its signal was aborted. */
export class RunAborted extends Error {
  constructor() {
    super('The simulation run was stopped')
    this.name = 'RunAborted'
  }
}

/** Merges the blocks of a run and summarises them with the engine. */
export function mergeBlocks(model: SimulationModel, partials: readonly BlockPartial[]): SimulationResult {
  return model === 'establishment'
    ? summarizeEstablishment(mergeEstablishmentPartials(partials as EstablishmentPartial[]))
    : summarizeRescue(mergeRescuePartials(partials as RescuePartial[]))
}

export class ReplicatePool {
  readonly threads: number
  private readonly pool: Tinypool

  /**
   * @param threads - worker threads, integer ≥ 1 (started on first use, kept while idle)
   */
  constructor(threads: number) {
    if (!Number.isInteger(threads) || threads < 1) throw new RangeError(`ReplicatePool: threads must be an integer ≥ 1, got ${threads}`)
    this.threads = threads
    this.pool = new Tinypool({
      filename: new URL('./block-task-entry.mjs', import.meta.url).href,
      minThreads: 1,
      maxThreads: threads,
      idleTimeout: 60_000,
    })
  }

  /**
   * Runs all replicates of `run` and returns the engine's summary.
   *
   * @param run - model, parameters, seed and replicates (≥ 1)
   * @param options - progress callback, abort signal, block count
   * @returns the same result as `simulateEstablishment` / `simulateRescue` with that seed
   * @throws RunAborted when the signal aborts; the engine's RangeError for bad parameters
   */
  async run(run: PoolRun, options: PoolRunOptions = {}): Promise<SimulationResult> {
    const { signal, onProgress } = options
    if (signal?.aborted) throw new RunAborted()
    // One controller for the blocks: the caller's abort, or the first failing block, stops the rest.
    const blocks = new AbortController()
    setMaxListeners(0, blocks.signal) // the pool listens once per queued block
    const forward = () => blocks.abort()
    signal?.addEventListener('abort', forward, { once: true })
    const ranges = splitReplicates(run.replicates, options.blocks ?? blockCount(run.replicates, this.threads)).filter(range => range.count > 0)
    let completed = 0
    const tasks = ranges.map(async (range) => {
      const task: BlockTask = { model: run.model, parameters: run.parameters, seed: run.seed, firstReplicate: range.first, replicates: range.count }
      const partial = await this.pool.run(task, { signal: blocks.signal }) as BlockPartial
      completed += range.count
      if (!blocks.signal.aborted) onProgress?.(completed, run.replicates)
      return partial
    })
    try {
      const partials = await Promise.all(tasks)
      if (signal?.aborted) throw new RunAborted()
      return mergeBlocks(run.model, partials)
    } catch (error) {
      blocks.abort()
      // Let every block settle so no thread keeps working for a run nobody waits for.
      await Promise.allSettled(tasks)
      if (signal?.aborted) throw new RunAborted()
      throw error
    } finally {
      signal?.removeEventListener('abort', forward)
    }
  }

  /** Stops the threads (running blocks are abandoned). */
  async destroy(): Promise<void> {
    await this.pool.destroy()
  }
}
