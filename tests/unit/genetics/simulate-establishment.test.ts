import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import {
  frequencyAfterSelection, mergeEstablishmentPartials, runEstablishmentReplicates, simulateEstablishment,
  summarizeEstablishment,
} from '../../../shared/genetics/simulate/establishment'
import type { EstablishmentParams } from '../../../shared/genetics/simulate/establishment'
import { splitReplicates } from '../../../shared/genetics/simulate/replicate-ranges'
import { exactFixationProbabilities } from '../../../shared/genetics/exact'
import { DriftStepCache } from '../../../shared/genetics/simulate/establishment/drift-step-cache'
import { binomialDraw, replicateStream } from '../../../shared/genetics/simulate/random'

interface ChainCase { census: number, s: number, h: number, copies: number, expected: number, diffusion: number | null }
interface BelowCensusCase { census: number, effectiveSize: number, s: number, h: number, copies: number, chain: number, diffusion: number }
const fixture = JSON.parse(readFileSync(new URL('../../fixtures/genetics/simulate-establishment.json', import.meta.url), 'utf8')) as {
  exactChain: ChainCase[]
  effectiveBelowCensus: BelowCensusCase[]
  neutral: { census: number, effectiveSize: number, copies: number, expected: number }[]
  conditionalFixationTime: { census: number, s: number, h: number, copies: number, expected: number, diffusion: number }
}

/** Four binomial standard errors of a proportion u estimated from R replicates. */
function tolerance(u: number, replicates: number): number {
  return 4 * Math.sqrt(u * (1 - u) / replicates)
}

/** Replicates so that 4 standard errors are about `relative` of u. */
function replicatesFor(u: number, relative: number): number {
  return Math.min(400_000, Math.ceil(16 * (1 - u) / (u * relative * relative)))
}

/** One introduction of exactly `copies` genes into the existing gene pool (p0 = copies/2N), long horizon. */
function singleIntroduction(census: number, effectiveSize: number, s: number, h: number, copies: number): EstablishmentParams {
  return { census, effectiveSize, s, h, introducedCopies: copies, migrantsPerEvent: 0, eventInterval: 1, events: 1, generations: 200_000 }
}

describe('simulateEstablishment against the exact Wright–Fisher chain (Ne = N, one event)', () => {
  for (const c of fixture.exactChain) {
    it(`N = ${c.census}, s = ${c.s}, h = ${c.h}, k = ${c.copies}: u = ${c.expected}`, () => {
      const replicates = replicatesFor(c.expected, 0.12)
      const result = simulateEstablishment(singleIntroduction(c.census, c.census, c.s, c.h, c.copies), { seed: 2024, replicates })
      expect(result.unresolved).toBe(0)
      expect(Math.abs(result.probability - c.expected)).toBeLessThanOrEqual(tolerance(c.expected, replicates))
      // Where the diffusion is off by more than the sampling error, the simulation must side with the chain.
      if (c.diffusion !== null && Math.abs(c.diffusion - c.expected) > 2 * tolerance(c.expected, replicates)) {
        expect(Math.abs(result.probability - c.diffusion)).toBeGreaterThan(tolerance(c.expected, replicates))
      }
    })
  }

  it('agrees with the exact module for a partly recessive allele and several copies', () => {
    const census = 30
    const copies = 3
    const u = exactFixationProbabilities({ census, s: 0.05, h: 0.25 })[copies] ?? Number.NaN
    const replicates = replicatesFor(u, 0.1)
    const result = simulateEstablishment(singleIntroduction(census, census, 0.05, 0.25, copies), { seed: 5, replicates })
    expect(Math.abs(result.probability - u)).toBeLessThanOrEqual(tolerance(u, replicates))
  })

  it('mixes migrants drawn from the source as (2N·p + c)/(2N + 2k)', () => {
    // Expected value from the exact module: sum over the migrants' copies c ~ Binomial(2k, q)
    // and the first drift step from p = c/(2N + 2k).
    const census = 20
    const migrants = 3
    const q = 0.4
    const s = 0.2
    const h = 0.5
    const u = exactFixationProbabilities({ census, s, h })
    const binomial = (n: number, p: number, k: number): number => {
      let choose = 1
      for (let i = 1; i <= k; i++) choose = choose * (n - i + 1) / i
      return choose * p ** k * (1 - p) ** (n - k)
    }
    let expected = 0
    for (let c = 0; c <= 2 * migrants; c++) {
      const selected = frequencyAfterSelection(c / (2 * census + 2 * migrants), s, h)
      for (let j = 0; j <= 2 * census; j++) expected += binomial(2 * migrants, q, c) * binomial(2 * census, selected, j) * (u[j] ?? 0)
    }
    const replicates = 40_000
    const result = simulateEstablishment({
      census, effectiveSize: census, s, h, sourceFrequency: q, migrantsPerEvent: migrants, eventInterval: 1, events: 1, generations: 100_000,
    }, { seed: 77, replicates })
    expect(Math.abs(result.probability - expected)).toBeLessThanOrEqual(tolerance(expected, replicates))
  })

  it('reproduces the exact chain\'s mean time to fixation, not the diffusion\'s', () => {
    const c = fixture.conditionalFixationTime
    const result = simulateEstablishment(singleIntroduction(c.census, c.census, c.s, c.h, c.copies), { seed: 31, replicates: 20_000 })
    const mean = result.meanTimeToEstablishment ?? Number.NaN
    // Standard error from the spread of the simulated times (interquartile range / 1.35 ≈ sd).
    const spread = ((result.timeToEstablishment.q75 ?? 0) - (result.timeToEstablishment.q25 ?? 0)) / 1.35
    const standardError = spread / Math.sqrt(result.established)
    expect(Math.abs(mean - c.expected)).toBeLessThanOrEqual(4 * standardError)
    expect(Math.abs(mean - c.diffusion)).toBeGreaterThan(4 * standardError)
  })
})

describe('simulateEstablishment with Ne < N', () => {
  for (const c of fixture.effectiveBelowCensus) {
    it(`N = ${c.census}, Ne = ${c.effectiveSize}, s = ${c.s}, h = ${c.h}, k = ${c.copies}`, () => {
      const replicates = replicatesFor(c.chain, 0.08)
      const result = simulateEstablishment(singleIntroduction(c.census, c.effectiveSize, c.s, c.h, c.copies), { seed: 99, replicates })
      // The model itself (independent chain computation): sampling error only.
      expect(Math.abs(result.probability - c.chain)).toBeLessThanOrEqual(tolerance(c.chain, replicates))
      // Kimura's diffusion (SCIENCE.md §1.6): sampling error plus the diffusion's own error (≤ 5 %).
      expect(Math.abs(result.probability - c.diffusion)).toBeLessThanOrEqual(tolerance(c.diffusion, replicates) + 0.05 * c.diffusion)
    })
  }

  it('shows the Ne/N factor: with Ne = N/10 a single copy establishes about 10× less often', () => {
    const replicates = 100_000
    const full = simulateEstablishment(singleIntroduction(1000, 1000, 0.1, 0.5, 1), { seed: 3, replicates })
    const tenth = simulateEstablishment(singleIntroduction(1000, 100, 0.1, 0.5, 1), { seed: 3, replicates })
    expect(full.probability / tenth.probability).toBeGreaterThan(8)
    expect(full.probability / tenth.probability).toBeLessThan(12)
  })
})

describe('simulateEstablishment, neutral allele', () => {
  for (const c of fixture.neutral) {
    it(`establishes with probability p0 = ${c.expected} (N = ${c.census}, Ne = ${c.effectiveSize})`, () => {
      const replicates = 40_000
      const result = simulateEstablishment(singleIntroduction(c.census, c.effectiveSize, 0, 0.5, c.copies), { seed: 8, replicates })
      expect(Math.abs(result.probability - c.expected)).toBeLessThanOrEqual(tolerance(c.expected, replicates))
    })
  }

  it('keeps u = p0 when Ne changes from generation to generation', () => {
    const replicates = 40_000
    const result = simulateEstablishment({
      census: 100, effectiveSize: [50, 5, 5, 80, 20, 100], s: 0, h: 0.5, introducedCopies: 20, migrantsPerEvent: 0, eventInterval: 1, events: 1, generations: 100_000,
    }, { seed: 12, replicates })
    expect(Math.abs(result.probability - 0.1)).toBeLessThanOrEqual(tolerance(0.1, replicates))
  })
})

describe('simulateEstablishment, schedules and migration', () => {
  it('fixes A under continuing migration from a fixed source (q = 1)', () => {
    const result = simulateEstablishment({
      census: 50, effectiveSize: 50, s: 0, h: 0.5, sourceFrequency: 1, migrantsPerEvent: 0, eventInterval: 1, events: 0, migrationRate: 0.2, generations: 500,
    }, { seed: 1, replicates: 200 })
    expect(result.established).toBe(200)
  })

  it('loses every replicate when the source lacks A', () => {
    const result = simulateEstablishment({
      census: 100, effectiveSize: 100, s: 0.1, h: 0.5, sourceFrequency: 0, migrantsPerEvent: 5, eventInterval: 1, events: 1, generations: 100,
    }, { seed: 1, replicates: 10 })
    expect(result.lost).toBe(10)
    expect(result.timeToLoss.q50).toBe(0)
  })

  it('waits for a late first event and measures times from it', () => {
    const result = simulateEstablishment({
      census: 20, effectiveSize: 20, s: 0.5, h: 1, introducedCopies: 40, migrantsPerEvent: 20, eventInterval: 1, events: 1, generations: 50, firstEventGeneration: 30,
    }, { seed: 1, replicates: 50 })
    // 40 copies in 20 animals joining 20 residents: p = 0.5 at generation 30.
    expect(result.trajectoryQuantiles.q50[30]).toBe(0.5)
    expect(result.trajectoryQuantiles.q95[29]).toBe(0)
    for (const time of [result.timeToEstablishment.q05, result.timeToLoss.q05]) {
      if (time !== null) expect(time).toBeGreaterThanOrEqual(1)
    }
  })

  it('more translocation events raise the establishment probability', () => {
    const base: EstablishmentParams = { census: 200, effectiveSize: 50, s: 0.05, h: 0.5, sourceFrequency: 0.3, migrantsPerEvent: 2, eventInterval: 5, events: 1, generations: 3000 }
    const replicates = 20_000
    const once = simulateEstablishment(base, { seed: 4, replicates })
    const five = simulateEstablishment({ ...base, events: 5 }, { seed: 4, replicates })
    expect(five.probability - once.probability).toBeGreaterThan(tolerance(once.probability, replicates) + tolerance(five.probability, replicates))
  })
})

describe('DriftStepCache', () => {
  it('draws exactly what binomialDraw draws after the selection step', () => {
    for (const [genes, s, h] of [[20, 0.1, 0.5], [2000, 0.01, 0.5], [300, -0.05, 1]] as const) {
      const cache = new DriftStepCache(genes, s, h)
      const cached = replicateStream(genes, 1)
      const direct = replicateStream(genes, 1)
      for (let copies = 1; copies < genes; copies += Math.ceil(genes / 37)) {
        for (let repeat = 0; repeat < 3; repeat++) {
          expect(cache.draw(cached, copies)).toBe(binomialDraw(direct, genes, frequencyAfterSelection(copies / genes, s, h)))
        }
      }
    }
  })
})

describe('simulateEstablishment results', () => {
  const params = singleIntroduction(50, 25, 0.1, 0.5, 5)

  it('are identical for the same seed and differ for another seed', () => {
    const a = simulateEstablishment(params, { seed: 10, replicates: 500 })
    expect(simulateEstablishment(params, { seed: 10, replicates: 500 })).toEqual(a)
    expect(simulateEstablishment(params, { seed: 11, replicates: 500 })).not.toEqual(a)
  })

  it('merge to the same answer whether run as 1 × 100, 4 × 25 or 3 uneven blocks in any order', () => {
    const whole = runEstablishmentReplicates(params, { seed: 6, firstReplicate: 0, replicates: 100 })
    const quarters = [0, 25, 50, 75].map(first => runEstablishmentReplicates(params, { seed: 6, firstReplicate: first, replicates: 25 }))
    const uneven = splitReplicates(100, 3).map(range => runEstablishmentReplicates(params, { seed: 6, firstReplicate: range.first, replicates: range.count }))
    expect(mergeEstablishmentPartials(quarters)).toEqual(whole)
    expect(mergeEstablishmentPartials([...quarters].reverse())).toEqual(whole)
    expect(summarizeEstablishment(mergeEstablishmentPartials(uneven))).toEqual(summarizeEstablishment(whole))
    expect(summarizeEstablishment(whole)).toEqual(simulateEstablishment(params, { seed: 6, replicates: 100 }))
  })

  it('refuse blocks with gaps or overlaps', () => {
    const a = runEstablishmentReplicates(params, { seed: 6, firstReplicate: 0, replicates: 10 })
    const c = runEstablishmentReplicates(params, { seed: 6, firstReplicate: 20, replicates: 10 })
    expect(() => mergeEstablishmentPartials([a, c])).toThrow(RangeError)
    expect(() => mergeEstablishmentPartials([a, a])).toThrow(RangeError)
    expect(() => mergeEstablishmentPartials([])).toThrow(RangeError)
  })

  it('count every replicate once, bound the interval around the estimate and report progress', () => {
    const progress: number[] = []
    const result = simulateEstablishment(params, { seed: 2, replicates: 300, onProgress: done => progress.push(done) })
    expect(result.established + result.lost + result.unresolved).toBe(300)
    expect(result.interval95[0]).toBeLessThanOrEqual(result.probability)
    expect(result.interval95[1]).toBeGreaterThanOrEqual(result.probability)
    expect(progress.at(-1)).toBe(300)
    expect(result.trajectoryQuantiles.generation[0]).toBe(0)
    expect(result.trajectoryQuantiles.q50[0]).toBe(0.05)
    const { q05, q25, q50, q75, q95 } = result.trajectoryQuantiles
    q50.forEach((median, j) => {
      expect(q05[j] ?? 0).toBeLessThanOrEqual(q25[j] ?? 0)
      expect(q25[j] ?? 0).toBeLessThanOrEqual(median)
      expect(median).toBeLessThanOrEqual(q75[j] ?? 0)
      expect(q75[j] ?? 0).toBeLessThanOrEqual(q95[j] ?? 0)
    })
  })

  it('reject inputs outside the domain', () => {
    const options = { seed: 1, replicates: 10 }
    expect(() => simulateEstablishment({ ...params, s: -1 }, options)).toThrow('simulateEstablishment: s must be')
    expect(() => simulateEstablishment({ ...params, census: 10.5 }, options)).toThrow('census must be an integer ≥ 1, got 10.5')
    expect(() => simulateEstablishment({ ...params, effectiveSize: [] }, options)).toThrow(RangeError)
    expect(() => simulateEstablishment({ ...params, introducedCopies: undefined }, options)).toThrow('sourceFrequency must be given unless introducedCopies is')
    expect(() => simulateEstablishment({ ...params, migrantsPerEvent: 1, introducedCopies: 3 }, options)).toThrow('introducedCopies must be ≤ 2·migrantsPerEvent (2), got 3')
    expect(() => simulateEstablishment({ ...params, migrationRate: 2 }, options)).toThrow(RangeError)
    expect(() => simulateEstablishment(params, { seed: 1, replicates: 0 })).toThrow(RangeError)
  })
})
