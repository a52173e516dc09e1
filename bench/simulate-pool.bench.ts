/**
 * The worker's thread pool (worker/replicate-pool.ts) on one simulation run: wall time with 1,
 * 2 and (when the machine has them) 4 threads, the speed-up over 1 thread, and a check that
 * every thread count gives the identical result (each replicate has its own random stream).
 * Individual-based model, N = 200 recipient and source, default load (2000 loci) and 200
 * markers, 50 generations, 40 replicates; and the allele-frequency model, N = Ne = 1000,
 * 100 000 replicates. Threads are started and warmed up before timing (a real worker keeps
 * its threads); their start-up is printed apart.
 *
 * Then the individual-based bar of issue 4 measured rather than projected: 200 replicates of
 * bench/simulate.bench.ts's model (N = 500, 2000 load + 200 marker loci, 100 generations, phase
 * only) through the pool on 2 threads, wall time of one run (target ≤ 60 s).
 */
import { availableParallelism } from 'node:os'
import type { EstablishmentParams, RescueParams } from '../shared/genetics/simulate'
import { ReplicatePool, type PoolRun } from '../worker/replicate-pool'
import { rescueParams } from './simulate.bench'

const rescue: RescueParams = {
  recipient: { census: 200, effectiveRatio: 0.5, burnInGenerations: 50 },
  source: { census: 200, burnInGenerations: 50 },
  generations: 50,
  adaptive: { s: 0.1, h: 0.5, sourceFrequency: 0.5 },
  translocation: { migrantsPerEvent: 5, eventInterval: 10, events: 5 },
}
const establishment: EstablishmentParams = {
  census: 1000, effectiveSize: 1000, s: 0.01, h: 0.5, sourceFrequency: 0.5, migrantsPerEvent: 10, eventInterval: 1, events: 1, generations: 10_000,
}

async function measure(label: string, run: PoolRun): Promise<void> {
  const counts = [1, 2, 4].filter(threads => threads === 1 || threads <= availableParallelism())
  console.log(`${label}`)
  let base = 0
  let reference = ''
  for (const threads of counts) {
    const pool = new ReplicatePool(threads)
    const warming = performance.now()
    await pool.run({ ...run, replicates: threads * 2 }, { blocks: threads * 2 })
    const warmUp = (performance.now() - warming) / 1000
    const started = performance.now()
    const result = await pool.run(run)
    const seconds = (performance.now() - started) / 1000
    await pool.destroy()
    const json = JSON.stringify(result)
    if (threads === 1) {
      base = seconds
      reference = json
    }
    console.log(`  ${threads} thread${threads === 1 ? ' ' : 's'}: ${seconds.toFixed(2)} s wall, speed-up ${(base / seconds).toFixed(2)}× (start-up and warm-up ${warmUp.toFixed(2)} s), result ${json === reference ? 'identical to 1 thread' : 'DIFFERENT from 1 thread'}`)
  }
}

/** The individual-based bar, measured: 200 replicates on 2 threads, wall time. */
async function measureRescueBar(): Promise<void> {
  const threads = Math.min(2, availableParallelism())
  const pool = new ReplicatePool(threads)
  const parameters = rescueParams(500, 2000, 200, 100, 0)
  await pool.run({ model: 'rescue', parameters, seed: 7, replicates: 2 * threads }, { blocks: 2 * threads }) // start-up and warm-up
  const started = performance.now()
  await pool.run({ model: 'rescue', parameters, seed: 7, replicates: 200 })
  const seconds = (performance.now() - started) / 1000
  await pool.destroy()
  console.log(`Individual-based bar, measured: N = 500, 2000 load + 200 marker loci, 100 generations (phase only), 200 replicates on ${threads} thread${threads === 1 ? '' : 's'}: ${seconds.toFixed(1)} s wall (target ≤ 60 s on 2 cores: ${threads < 2 ? 'not measurable here, fewer than 2 cores' : seconds <= 60 ? 'met' : 'NOT met'})`)
}

export default async function (): Promise<void> {
  console.log(`cores available: ${availableParallelism()}`)
  await measure('Individual-based model, N = 200, 2000 load + 200 marker loci, 50 generations (burn-in 50), 40 replicates', { model: 'rescue', parameters: rescue, seed: 11, replicates: 40 })
  await measure('Allele-frequency model, N = Ne = 1000, 100 000 replicates', { model: 'establishment', parameters: establishment, seed: 11, replicates: 100_000 })
  await measureRescueBar()
}
