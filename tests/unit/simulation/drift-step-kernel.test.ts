/**
 * The WebAssembly drift-step kernel (kernels/drift-step.ts) must make bit-for-bit the draws of
 * the TypeScript sampler it replaces in quiet stretches, so that using it never changes a result:
 * - its logarithm is fdlibm's, the algorithm of V8's Math.log, compared with Math.log itself
 *   (the independent reference computation here) on arguments spread over every exponent;
 * - each lane continues its replicate's pure-rand xoroshiro128+ stream exactly and reaches the
 *   same counts, grid records and stopping points as `DriftStepCache.draw` run generation by
 *   generation (the reference), alone or with other lanes interleaved.
 * The end-to-end pin is engine-reproducibility.test.ts (digests of the first engine's results).
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus'
import type { RandomGenerator } from 'pure-rand/types/RandomGenerator'
import { DriftStepCache } from '../../../shared/genetics/simulate/establishment/drift-step-cache'
import {
  KERNEL_LANES, LANE_COUNT, LANE_GENERATION, LANE_GRID_INDEX, LANE_RECORDED, LANE_RECORDS, LANE_RECORD_CAPACITY,
  LANE_STATUS, LANE_STOPPED, LANE_WORDS,
} from '../../../shared/genetics/simulate/kernels/drift-step-kernel'
import { driftStepWasm } from '../../../shared/genetics/simulate/kernels/drift-step-wasm'

function kernelLog(): (x: number) => number {
  const bytes = Uint8Array.from(atob(driftStepWasm), character => character.charCodeAt(0))
  const instance = new WebAssembly.Instance(new WebAssembly.Module(bytes), { env: { memory: new WebAssembly.Memory({ initial: 1 }) } })
  return instance.exports.log as (x: number) => number
}

describe('kernel logarithm', () => {
  const log = kernelLog()

  it('equals Math.log on special and boundary arguments', () => {
    for (const x of [0, -0, -1, Infinity, -Infinity, Number.NaN, Number.MIN_VALUE, 2.2250738585072014e-308, 1, 2, 0.5, Math.SQRT2, Math.SQRT1_2, 1 + 2 ** -52, 1 - 2 ** -53, Number.MAX_VALUE]) {
      expect(Object.is(log(x), Math.log(x)), `log(${x})`).toBe(true)
    }
  })

  it('equals Math.log bit for bit on a million arguments across all exponents and near 1', () => {
    const random = xoroshiro128plus(2026)
    const bits = new Uint32Array(2)
    const value = new Float64Array(bits.buffer)
    let mismatches = 0
    for (let i = 0; i < 500_000; i++) {
      bits[0] = random.next() >>> 0
      bits[1] = (random.next() >>> 0) & 0x7fffffff // any positive double, subnormals included
      const anywhere = value[0] as number
      if (!Object.is(log(anywhere), Math.log(anywhere))) mismatches++
      const nearOne = 1 + ((random.next() >>> 0) / 2 ** 32 - 0.5) * 2 ** -18 // the |f| < 2⁻²⁰ branch and around it
      if (!Object.is(log(nearOne), Math.log(nearOne))) mismatches++
    }
    expect(mismatches).toBe(0)
  })
})

/** What a lane must end with: count, generation, records and the stream position. */
interface LaneOutcome { copies: number, generation: number, records: number[], nextValues: number[] }

/**
 * The reference: `DriftStepCache.draw` generation by generation from `copies` at `generation`,
 * recording the count before the draw at grid generations, until `end`, fixation or loss.
 */
function referenceRun(cache: DriftStepCache, random: RandomGenerator, copies: number, generation: number, end: number, grid: Int32Array): LaneOutcome {
  const records: number[] = []
  while (generation < end) {
    if (grid.includes(generation)) records.push(copies)
    copies = cache.draw(random, copies)
    generation++
    if (copies === 0 || copies === cache.genes) break
  }
  return { copies, generation, records, nextValues: [random.next(), random.next(), random.next()] }
}

/** The same stretch on the kernel's lanes, each lane with its own stream, all run together. */
function kernelRuns(cache: DriftStepCache, seeds: number[], copies: number, generation: number, end: number, grid: Int32Array): LaneOutcome[] {
  const kernel = cache.kernel
  const records = seeds.map(() => [] as number[])
  const gridIndex = grid.findIndex(point => point >= generation)
  seeds.forEach((seed, lane) => kernel.startLane(lane, xoroshiro128plus(seed), copies, generation, end, gridIndex < 0 ? grid.length : gridIndex))
  for (let lane = seeds.length; lane < KERNEL_LANES; lane++) kernel.lanes[lane * LANE_WORDS + LANE_STATUS] = 0
  const done = seeds.map(() => false)
  while (done.includes(false)) {
    kernel.runLanes()
    seeds.forEach((_, lane) => {
      const at = lane * LANE_WORDS
      if (done[lane] || kernel.lanes[at + LANE_STATUS] !== LANE_STOPPED) return
      const recorded = kernel.lanes[at + LANE_RECORDED] as number
      for (let record = 0; record < recorded; record++) records[lane]?.push(kernel.lanes[at + LANE_RECORDS + record] as number)
      const count = kernel.lanes[at + LANE_COUNT] as number
      if (count === 0 || count === cache.genes || (kernel.lanes[at + LANE_GENERATION] as number) >= end) {
        done[lane] = true
        return
      }
      cache.prepare(count)
      kernel.resumeLane(lane)
    })
  }
  return seeds.map((_, lane) => {
    const at = lane * LANE_WORDS
    const stream = kernel.laneStream(lane)
    return {
      copies: kernel.lanes[at + LANE_COUNT] as number,
      generation: kernel.lanes[at + LANE_GENERATION] as number,
      records: records[lane] ?? [],
      nextValues: [stream.next(), stream.next(), stream.next()],
    }
  })
}

describe('drift-step kernel lanes', () => {
  it('reproduce DriftStepCache.draw draw for draw, stream position included, for any n, s, h and start', () => {
    fc.assert(fc.property(
      fc.integer({ min: 2, max: 4000 }),
      fc.double({ min: -0.3, max: 0.5, noNaN: true }),
      fc.double({ min: 0, max: 1, noNaN: true }),
      fc.double({ min: 0, max: 1, noNaN: true }),
      fc.integer({ min: 1, max: KERNEL_LANES }),
      fc.integer(),
      (genes, s, h, startFraction, laneCount, seed) => {
        const copies = Math.min(genes - 1, Math.max(1, Math.round(startFraction * genes)))
        const grid = Int32Array.from({ length: 40 }, (_, j) => 3 + j * 7)
        const end = 250
        const seeds = Array.from({ length: laneCount }, (_, lane) => seed + lane)
        const lanes = kernelRuns(new DriftStepCache(genes, s, h, grid), seeds, copies, 2, end, grid)
        const reference = new DriftStepCache(genes, s, h)
        seeds.forEach((laneSeed, lane) => {
          expect(lanes[lane]).toEqual(referenceRun(reference, xoroshiro128plus(laneSeed), copies, 2, end, grid))
        })
      },
    ), { numRuns: 60 })
  })

  it('stops a lane whose record buffer is full and goes on after it is read, recording every grid point', () => {
    const grid = Int32Array.from({ length: 3 * LANE_RECORD_CAPACITY }, (_, j) => j)
    const cache = new DriftStepCache(20_000, 0, 0.5, grid)
    const [lane] = kernelRuns(cache, [7], 10_000, 0, grid.length, grid)
    const reference = referenceRun(new DriftStepCache(20_000, 0, 0.5), xoroshiro128plus(7), 10_000, 0, grid.length, grid)
    expect(lane).toEqual(reference)
    expect(lane?.records).toHaveLength(grid.length) // neutral, 2N = 20 000: no absorption within 192 generations
  })

  it('stops before a count whose constants are not filled and leaves the lane where it was', () => {
    const cache = new DriftStepCache(1000, 0.05, 0.5)
    const kernel = cache.kernel
    kernel.startLane(0, xoroshiro128plus(3), 400, 10, 100, 0)
    for (let lane = 1; lane < KERNEL_LANES; lane++) kernel.lanes[lane * LANE_WORDS + LANE_STATUS] = 0
    kernel.runLanes()
    expect(kernel.lanes[LANE_STATUS]).toBe(LANE_STOPPED)
    expect(kernel.lanes[LANE_GENERATION]).toBe(10)
    expect(kernel.lanes[LANE_COUNT]).toBe(400)
    expect(kernel.lanes[LANE_GRID_INDEX]).toBe(0)
    expect(kernel.laneStream(0).next()).toBe(xoroshiro128plus(3).next())
  })
})
