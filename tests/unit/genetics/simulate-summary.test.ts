import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  orderIndependentMean, quantileOfHistogram, quantileOfSorted, quantilesOf, wilsonInterval,
} from '../../../shared/genetics/simulate/summary'
import { expandSchedule } from '../../../shared/genetics/simulate/schedule'
import { orderedBlocks, splitReplicates } from '../../../shared/genetics/simulate/replicate-ranges'

const fixture = JSON.parse(readFileSync(new URL('../../fixtures/genetics/simulate-summary.json', import.meta.url), 'utf8')) as {
  tolerance: { relative: number }
  wilson: { successes: number, trials: number, low: number, high: number }[]
  quantiles: { values: number[], expected: number[] }[]
}

const close = (actual: number | null, expected: number): boolean =>
  actual !== null && Math.abs(actual - expected) <= fixture.tolerance.relative * Math.max(Math.abs(expected), 1e-300)

describe('wilsonInterval', () => {
  for (const c of fixture.wilson) {
    it(`${c.successes}/${c.trials} agrees with scipy`, () => {
      const [low, high] = wilsonInterval(c.successes, c.trials)
      expect(close(low, c.low) || (c.low === 0 && low === 0)).toBe(true)
      expect(close(high, c.high)).toBe(true)
    })
  }

  it('always brackets the estimate inside [0, 1]', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 100_000 }), fc.double({ min: 0, max: 1, noNaN: true }), (trials, share) => {
      const successes = Math.round(share * trials)
      const [low, high] = wilsonInterval(successes, trials)
      const estimate = successes / trials
      return low >= 0 && low <= estimate && estimate <= high && high <= 1
    }))
  })

  it('rejects impossible counts', () => {
    expect(() => wilsonInterval(5, 4)).toThrow('wilsonInterval: successes must be ≤ trials (4), got 5')
    expect(() => wilsonInterval(1, 0)).toThrow(RangeError)
  })
})

describe('quantiles (Hyndman–Fan definition 7)', () => {
  for (const c of fixture.quantiles) {
    it(`match numpy.quantile for ${JSON.stringify(c.values)}`, () => {
      const q = quantilesOf(c.values)
      const got = [q.q05, q.q25, q.q50, q.q75, q.q95]
      got.forEach((value, i) => expect(close(value, c.expected[i] ?? Number.NaN)).toBe(true))
    })
  }

  it('give null for no data and the value itself for one', () => {
    expect(quantileOfSorted([], 0.5)).toBeNull()
    expect(quantileOfSorted([7], 0.95)).toBe(7)
    expect(quantilesOf([])).toEqual({ q05: null, q25: null, q50: null, q75: null, q95: null })
    expect(orderIndependentMean([])).toBeNull()
  })

  it('from a histogram equal the quantiles of the expanded data', () => {
    fc.assert(fc.property(fc.array(fc.integer({ min: 0, max: 6 }), { minLength: 1, maxLength: 12 }), fc.double({ min: 0, max: 1, noNaN: true }), (counts, probability) => {
      const values: number[] = []
      counts.forEach((count, bin) => {
        for (let i = 0; i < count; i++) values.push(bin * 0.25)
      })
      const fromHistogram = quantileOfHistogram(counts, bin => bin * 0.25, probability)
      const direct = quantileOfSorted(values, probability)
      return direct === null ? fromHistogram === null : Math.abs((fromHistogram ?? Number.NaN) - direct) < 1e-12
    }))
  })

  it('orderIndependentMean does not depend on the order of the values', () => {
    fc.assert(fc.property(fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 50 }), (values) => {
      return orderIndependentMean(values) === orderIndependentMean([...values].reverse())
    }))
  })
})

describe('replicate ranges and schedules', () => {
  it('splitReplicates covers every replicate once, in order, in near-equal blocks', () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 1000 }), fc.integer({ min: 1, max: 16 }), (total, parts) => {
      const ranges = splitReplicates(total, parts)
      let next = 0
      for (const range of ranges) {
        if (range.first !== next) return false
        next += range.count
      }
      const sizes = ranges.map(range => range.count)
      return next === total && ranges.length === parts && Math.max(...sizes) - Math.min(...sizes) <= 1
    }))
  })

  it('orderedBlocks sorts consecutive blocks and rejects gaps', () => {
    const blocks = [{ firstReplicate: 5, replicates: 5 }, { firstReplicate: 0, replicates: 5 }]
    expect(orderedBlocks('merge', blocks).map(block => block.firstReplicate)).toEqual([0, 5])
    expect(() => orderedBlocks('merge', [{ firstReplicate: 0, replicates: 4 }, { firstReplicate: 5, replicates: 5 }])).toThrow(RangeError)
  })

  it('expandSchedule repeats the last value and checks every entry', () => {
    expect(Array.from(expandSchedule('f', 'census', [100, 20], 4, v => v >= 1, '≥ 1'))).toEqual([100, 20, 20, 20])
    expect(Array.from(expandSchedule('f', 'census', 50, 2, v => v >= 1, '≥ 1'))).toEqual([50, 50])
    expect(() => expandSchedule('f', 'census', [100, 0], 4, v => v >= 1, '≥ 1')).toThrow('f: census[] must be ≥ 1, got 0')
    expect(() => expandSchedule('f', 'census', [], 4, v => v >= 1, '≥ 1')).toThrow(RangeError)
  })
})
