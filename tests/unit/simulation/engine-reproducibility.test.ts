/**
 * A stored simulation run promises: the same model, parameters, seed and replicates under the
 * same SIMULATION_ENGINE_VERSION give the same result, bit for bit. These digests pin that
 * promise: they are SHA-256 prefixes of JSON.stringify(result) computed with the engine as
 * first committed (commit 13b090c, "Simulation engine: seeded allele-frequency and
 * individual-based rescue models …", engine version simulate-1.0.0), before the speed-ups of
 * the allele-frequency model (setup-array BTRD, cached acceptance tables, quiet-stretch loop,
 * jumps by table, the WebAssembly drift-step kernel running replicates side by side) and of the
 * individual-based model (WebAssembly kernels for gamete words, fitness sums, pedigree kinship and
 * allele counts), which must not change any draw.
 *
 * If this test fails after a change under shared/genetics/simulate, the change alters results
 * for a given seed: either undo that, or bump SIMULATION_ENGINE_VERSION (so stored runs say
 * which engine made them) and replace the digests with the new engine's, saying so here.
 */
import { createHash } from 'node:crypto'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { binomialDraw, replicateStream, simulateEstablishment, simulateRescue } from '../../../shared/genetics'
import type { EstablishmentParams } from '../../../shared/genetics'
import { xoroshiro128plus, xoroshiro128plusFromState } from 'pure-rand/generator/xoroshiro128plus'
import { DriftStepCache } from '../../../shared/genetics/simulate/establishment/drift-step-cache'
import { jumpedState } from '../../../shared/genetics/simulate/random/jump-table'
import { ReplicateStreams } from '../../../shared/genetics/simulate/random/streams'
import { frequencyAfterSelection } from '../../../shared/genetics/simulate/establishment/selection-step'
import { SIMULATION_ENGINE_VERSION } from '../../../shared/simulation/engine-version'

const digest = (value: unknown): string => createHash('sha256').update(JSON.stringify(value)).digest('hex').slice(0, 16)

const cases: [EstablishmentParams, number][] = [
  // N = Ne = 1000 as in bench/simulate.bench.ts: mostly BTRD draws from the cached counts.
  [{ census: 1000, effectiveSize: 1000, s: 0.01, h: 0.5, sourceFrequency: 0.5, migrantsPerEvent: 10, eventInterval: 1, events: 1, generations: 10000 }, 3000],
  // Exact copies, small N: inversion tables.
  [{ census: 50, effectiveSize: 25, s: 0.1, h: 0.5, introducedCopies: 5, migrantsPerEvent: 0, eventInterval: 1, events: 1, generations: 5000 }, 5000],
  // Schedules of census and Ne, repeated events, continuing migration: the general loop.
  [{ census: [200, 100, 60], effectiveSize: [80, 40.5, 20], s: -0.02, h: 0.2, sourceFrequency: 0.7, migrantsPerEvent: 6, eventInterval: 3, events: 5, migrationRate: 0.01, generations: 400 }, 2000],
  // Strong selection, events every 10 generations.
  [{ census: 5000, effectiveSize: 1234.5, s: 0.3, h: 0.9, sourceFrequency: 0.05, migrantsPerEvent: 20, eventInterval: 10, events: 3, generations: 3000 }, 1000],
  // 2·Ne above the cached range: uncached draws.
  [{ census: 30000, effectiveSize: 40000, s: 0.002, h: 0.5, sourceFrequency: 0.5, migrantsPerEvent: 100, eventInterval: 1, events: 1, generations: 2000 }, 200],
]

/** values[0] for `every` generations, then values[1], … cycling, over `length` generations. */
const cycle = (values: number[], every: number, length: number): number[] => Array.from({ length }, (_, g) => values[Math.floor(g / every) % values.length] as number)

/**
 * Ne changing every 40 generations without migration: short quiet stretches on four drift-step
 * kernels at once, replicates moving between them on the kernels' lanes.
 */
const SCHEDULE_CASE: EstablishmentParams = {
  census: cycle([300, 120, 80, 200], 40, 800), effectiveSize: cycle([150, 60, 40, 100], 40, 800),
  s: 0.04, h: 0.3, sourceFrequency: 0.4, migrantsPerEvent: 4, eventInterval: 100, events: 4, generations: 800,
}
/** Seeds 1 and 987654321, 3000 replicates, computed with the engine at commit c95b281 (which gives the digests above too). */
const SCHEDULE_DIGESTS = ['c829e2e1f9734422', '8c506239b3e9c991']

/** Digests for seeds 1 and 987654321 of each case, in order (engine at commit 13b090c). */
const ESTABLISHMENT_DIGESTS = [
  '9ee1c794e705e56d', '664069ea11ccc45a',
  'f48d096c5d363eb0', 'ebed6c1c536cd678',
  '14bda8043f45e6ce', 'dfbe2b56016b9c76',
  'ca048c76ec776ad4', 'e0790e052c140fd2',
  'd44fc102a38b0c9f', '962ce5cc8369c507',
]
const RESCUE_DIGEST = '1e38e3211bab84b4'
/** With continuing migration (immigrant parents) and a census schedule; also computed with the engine at commit 13b090c. */
const RESCUE_MIGRATION_DIGEST = '54d329fb6fd5314c'

describe(`engine ${SIMULATION_ENGINE_VERSION}: same inputs and seed, same result`, () => {
  it('the allele-frequency model gives the recorded results', () => {
    const digests = cases.flatMap(([params, replicates]) => [1, 987654321].map(seed => digest(simulateEstablishment(params, { seed, replicates }))))
    expect(digests).toEqual(ESTABLISHMENT_DIGESTS)
  }, 60_000)

  it('the allele-frequency model gives the recorded results with a changing Ne and no migration', () => {
    expect([1, 987654321].map(seed => digest(simulateEstablishment(SCHEDULE_CASE, { seed, replicates: 3000 })))).toEqual(SCHEDULE_DIGESTS)
  }, 60_000)

  it('the individual-based model gives the recorded result', () => {
    const result = simulateRescue({
      recipient: { census: 30, effectiveRatio: 0.5, burnInGenerations: 30 }, source: { census: 80, burnInGenerations: 30 }, generations: 20,
      markerLoci: 100, load: { loci: 300 }, adaptive: { s: 0.1, h: 0.5, sourceFrequency: 0.5 }, translocation: { migrantsPerEvent: 3, eventInterval: 5, events: 3 },
    }, { seed: 5, replicates: 4 })
    expect(digest(result)).toBe(RESCUE_DIGEST)
  }, 60_000)

  it('the individual-based model gives the recorded result with continuing migration', () => {
    const result = simulateRescue({
      recipient: { census: [40, 36, 30, 34], effectiveRatio: 0.3, burnInGenerations: 20 }, source: { census: 60, burnInGenerations: 20 }, generations: 25,
      markerLoci: 64, load: { loci: 200 }, adaptive: { s: 0.1, h: 0.5, sourceFrequency: 0.5 }, translocation: { migrantsPerEvent: 2, eventInterval: 7, events: 3, migrationRate: 0.05 },
    }, { seed: 11, replicates: 4 })
    expect(digest(result)).toBe(RESCUE_MIGRATION_DIGEST)
  }, 60_000)

  it('cached drift steps (with BTRD acceptance tables) draw exactly what binomialDraw draws, many times per count', () => {
    fc.assert(fc.property(
      fc.integer({ min: 20, max: 5000 }), fc.double({ min: -0.5, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), fc.integer({ min: 0, max: 1000 }),
      (genes, s, h, seed) => {
        const cache = new DriftStepCache(genes, s, h)
        const cached = replicateStream(seed, 0)
        const direct = replicateStream(seed, 0)
        for (let copies = 1; copies < genes; copies += Math.max(1, Math.floor(genes / 23))) {
          for (let repeat = 0; repeat < 40; repeat++) {
            if (cache.draw(cached, copies) !== binomialDraw(direct, genes, frequencyAfterSelection(copies / genes, s, h))) return false
          }
        }
        return true
      },
    ), { numRuns: 60 })
  }, 60_000)
})

describe('jumps by table', () => {
  const word = fc.integer({ min: -2147483648, max: 2147483647 })
  it('jumpedState(state, k) is pure-rand\'s jump() applied k times', () => {
    fc.assert(fc.property(fc.tuple(word, word, word, word), fc.integer({ min: 0, max: 300 }), (state, jumps) => {
      const generator = xoroshiro128plusFromState(state)
      for (let jump = 0; jump < jumps; jump++) generator.jump()
      expect(jumpedState(state, jumps)).toEqual(generator.getState())
    }), { numRuns: 40 })
  })

  it('replicate streams are the seed\'s stream after r + 1 jumps, however they are reached', () => {
    for (const seed of [0, 1, -7, 123456789]) {
      const generator = xoroshiro128plus(seed)
      const walker = new ReplicateStreams(seed, 0)
      for (let replicate = 0; replicate < 70; replicate++) {
        generator.jump()
        const expected = generator.getState()
        expect(replicateStream(seed, replicate).getState()).toEqual(expected)
        expect(walker.next().getState()).toEqual(expected)
        if (replicate % 23 === 0) expect(new ReplicateStreams(seed, replicate).next().getState()).toEqual(expected)
      }
    }
  })
})
