/**
 * The worker's thread pool: any number of threads or blocks gives exactly the engine's
 * single-call result for the seed (each replicate has its own random stream), progress reaches
 * the total, and an abort stops the run.
 */
import { afterAll, describe, expect, it } from 'vitest'
import { simulateEstablishment, simulateRescue } from '../../../shared/genetics'
import type { EstablishmentParams, RescueParams } from '../../../shared/genetics'
import { ReplicatePool, RunAborted, blockCount } from '../../../worker/replicate-pool'

const establishment: EstablishmentParams = {
  census: 40, effectiveSize: 20, s: 0.08, h: 0.5, sourceFrequency: 0.4,
  migrantsPerEvent: 3, eventInterval: 4, events: 3, generations: 300,
}
const rescue: RescueParams = {
  recipient: { census: 20, effectiveRatio: 0.6, burnInGenerations: 20 },
  source: { census: 40, burnInGenerations: 20 },
  generations: 12,
  markerLoci: 64,
  load: { loci: 128 },
  adaptive: { s: 0.1, h: 0.5, sourceFrequency: 0.5 },
  translocation: { migrantsPerEvent: 3, eventInterval: 4, events: 2 },
}

const pools: ReplicatePool[] = []
function pool(threads: number): ReplicatePool {
  const created = new ReplicatePool(threads)
  pools.push(created)
  return created
}
afterAll(async () => {
  await Promise.all(pools.map(p => p.destroy()))
})

describe('ReplicatePool', () => {
  it('establishment: 1 thread, 2 threads and the engine called directly agree exactly', async () => {
    const direct = simulateEstablishment(establishment, { seed: 20240611, replicates: 400 })
    const one = await pool(1).run({ model: 'establishment', parameters: establishment, seed: 20240611, replicates: 400 })
    const two = await pool(2).run({ model: 'establishment', parameters: establishment, seed: 20240611, replicates: 400 }, { blocks: 7 })
    expect(one).toEqual(direct)
    expect(two).toEqual(direct)
  }, 60_000)

  it('rescue: 1 and 2 threads agree exactly with the engine, and another seed differs', async () => {
    const direct = simulateRescue(rescue, { seed: 7, replicates: 6 })
    const one = await pool(1).run({ model: 'rescue', parameters: rescue, seed: 7, replicates: 6 })
    const two = await pool(2).run({ model: 'rescue', parameters: rescue, seed: 7, replicates: 6 })
    expect(one).toEqual(direct)
    expect(two).toEqual(direct)
    const other = await pool(2).run({ model: 'rescue', parameters: rescue, seed: 8, replicates: 6 })
    expect(other).not.toEqual(direct)
  }, 120_000)

  it('reports progress block by block up to the total', async () => {
    const seen: number[] = []
    await pool(2).run({ model: 'establishment', parameters: establishment, seed: 1, replicates: 50 }, { blocks: 5, onProgress: done => seen.push(done) })
    expect(seen).toHaveLength(5)
    expect([...seen].sort((a, b) => a - b)).toEqual(seen)
    expect(seen.at(-1)).toBe(50)
  }, 60_000)

  it('stops with RunAborted when aborted, and rejects bad parameters with the engine\'s RangeError', async () => {
    const controller = new AbortController()
    const running = pool(1).run({ model: 'rescue', parameters: { ...rescue, generations: 400 }, seed: 3, replicates: 40 }, {
      signal: controller.signal,
      onProgress: () => controller.abort(),
    })
    await expect(running).rejects.toBeInstanceOf(RunAborted)
    const refused = pool(1).run({ model: 'establishment', parameters: { ...establishment, census: 0 }, seed: 1, replicates: 2 })
    await expect(refused).rejects.toThrow(/census must be an integer ≥ 1, got 0/)
    await expect(refused).rejects.toBeInstanceOf(RangeError)
  }, 60_000)

  it('blockCount: at least 20 blocks (or one per replicate), 4 per thread beyond that', () => {
    expect(blockCount(1, 8)).toBe(1)
    expect(blockCount(10, 2)).toBe(10)
    expect(blockCount(1000, 2)).toBe(20)
    expect(blockCount(1000, 16)).toBe(64)
  })
})
