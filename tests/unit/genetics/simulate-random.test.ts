import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  binomialDraw, binomialInversionFromTable, binomialInversionTable, binomialSetup, binomialWithSetup, BINOMIAL_SETUP_SIZE, logFactorial, ReplicateStreams, replicateStream, sampleBinomial, sampleGamma, sampleMultinomial,
  samplePoisson, sampleStandardNormal, sharedStream, spawnStream, uniform01, uniformIndex, WeightedSampler,
} from '../../../shared/genetics/simulate/random'
import type { RandomStream } from '../../../shared/genetics/simulate/random'

const fixture = JSON.parse(readFileSync(new URL('../../fixtures/genetics/simulate-random.json', import.meta.url), 'utf8')) as {
  tolerance: { relative: number }
  logFactorial: { k: number, expected: number }[]
}

/** z for a one-sided tail of 10⁻⁴: every seeded statistical check below fails by chance with probability ≤ 10⁻⁴. */
const Z_CRITICAL = 3.719

/** Chi-square critical value at upper tail 10⁻⁴ (Wilson–Hilferty 1931 cube-root approximation). */
function chiSquareCritical(degrees: number): number {
  const a = 2 / (9 * degrees)
  return degrees * (1 - a + Z_CRITICAL * Math.sqrt(a)) ** 3
}

/**
 * Pearson goodness of fit of draws against a pmf, pooling tail categories so
 * every expected count is ≥ 5. Returns the statistic and its critical value.
 */
function chiSquare(observed: Map<number, number>, pmf: (k: number) => number, support: number[], draws: number): { statistic: number, critical: number } {
  const cells: { observed: number, expected: number }[] = []
  let pending = { observed: 0, expected: 0 }
  for (const k of support) {
    pending.observed += observed.get(k) ?? 0
    pending.expected += pmf(k) * draws
    if (pending.expected >= 5) {
      cells.push(pending)
      pending = { observed: 0, expected: 0 }
    }
  }
  const last = cells[cells.length - 1]
  if (last) {
    last.observed += pending.observed
    last.expected += pending.expected
  }
  let statistic = 0
  for (const cell of cells) statistic += (cell.observed - cell.expected) ** 2 / cell.expected
  return { statistic, critical: chiSquareCritical(Math.max(1, cells.length - 1)) }
}

function tally(draw: () => number, draws: number): { counts: Map<number, number>, mean: number, variance: number } {
  const counts = new Map<number, number>()
  let sum = 0
  let sumSquares = 0
  for (let i = 0; i < draws; i++) {
    const value = draw()
    counts.set(value, (counts.get(value) ?? 0) + 1)
    sum += value
    sumSquares += value * value
  }
  const mean = sum / draws
  return { counts, mean, variance: (sumSquares - draws * mean * mean) / (draws - 1) }
}

/** Binomial pmf by direct summation of logs (independent of the sampler's code). */
function binomialPmf(trials: number, probability: number): (k: number) => number {
  let logChoose = 0
  const logs: number[] = [0]
  for (let k = 1; k <= trials; k++) {
    logChoose += Math.log(trials - k + 1) - Math.log(k)
    logs.push(logChoose)
  }
  return k => Math.exp((logs[k] ?? -Infinity) + k * Math.log(probability) + (trials - k) * Math.log1p(-probability))
}

function range(first: number, last: number): number[] {
  return Array.from({ length: last - first + 1 }, (_, i) => first + i)
}

describe('random streams', () => {
  it('are reproducible and distinct per replicate', () => {
    const first = replicateStream(42, 3)
    const again = replicateStream(42, 3)
    const other = replicateStream(42, 4)
    const a = [first.next(), first.next(), first.next()]
    expect([again.next(), again.next(), again.next()]).toEqual(a)
    expect([other.next(), other.next(), other.next()]).not.toEqual(a)
  })

  it('walk consecutive replicates exactly like replicateStream', () => {
    const streams = new ReplicateStreams(7, 5)
    for (let replicate = 5; replicate < 9; replicate++) {
      expect(streams.next().getState()).toEqual(replicateStream(7, replicate).getState())
    }
  })

  it('keep the shared stream apart from every replicate stream', () => {
    expect(sharedStream(1).getState()).not.toEqual(replicateStream(1, 0).getState())
  })

  it('spawn reproducible children', () => {
    expect(spawnStream(replicateStream(9, 0)).getState()).toEqual(spawnStream(replicateStream(9, 0)).getState())
  })

  it('reject bad seeds and indices', () => {
    expect(() => replicateStream(1.5, 0)).toThrow(RangeError)
    expect(() => replicateStream(1, -1)).toThrow('replicateStream: replicate must be an integer ≥ 0, got -1')
  })
})

describe('uniform01 and uniformIndex', () => {
  it('stay in range with the right mean and variance (1/12)', () => {
    const random = replicateStream(1, 0)
    const draws = 200_000
    let outside = 0
    const { mean, variance } = tally(() => {
      const value = uniform01(random)
      if (!(value >= 0 && value < 1)) outside++
      return value
    }, draws)
    expect(outside).toBe(0)
    expect(Math.abs(mean - 0.5)).toBeLessThan(Z_CRITICAL * Math.sqrt(1 / 12 / draws))
    expect(Math.abs(variance - 1 / 12)).toBeLessThan(Z_CRITICAL * Math.sqrt(1 / 180 / draws))
  })

  it('uniformIndex is uniform over 0…5', () => {
    const random = replicateStream(2, 0)
    const draws = 60_000
    const { counts } = tally(() => uniformIndex(random, 6), draws)
    const { statistic, critical } = chiSquare(counts, () => 1 / 6, range(0, 5), draws)
    expect(statistic).toBeLessThan(critical)
  })
})

describe('sampleBinomial', () => {
  // Cases cover the inversion branch (n·p < 10), the BTRD branch, p > ½
  // (reflection), small n and a large n.
  const cases: [number, number][] = [[10, 0.3], [2000, 0.001], [200, 0.04], [60, 0.5], [2000, 0.3], [2000, 0.93], [5, 0.999], [100_000, 0.2]]
  for (const [trials, probability] of cases) {
    it(`matches the Binomial(${trials}, ${probability}) pmf, mean and variance`, () => {
      const random = replicateStream(trials, Math.round(probability * 1000))
      const draws = 100_000
      const { counts, mean, variance } = tally(() => sampleBinomial(random, trials, probability), draws)
      const theoryMean = trials * probability
      const theoryVariance = theoryMean * (1 - probability)
      const excessKurtosis = (1 - 6 * probability * (1 - probability)) / theoryVariance
      expect(Math.abs(mean - theoryMean)).toBeLessThan(Z_CRITICAL * Math.sqrt(theoryVariance / draws))
      expect(Math.abs(variance - theoryVariance)).toBeLessThan(Z_CRITICAL * theoryVariance * Math.sqrt((2 + excessKurtosis) / draws))
      const { statistic, critical } = chiSquare(counts, binomialPmf(trials, probability), range(0, trials), draws)
      expect(statistic).toBeLessThan(critical)
    })
  }

  it('returns integers in [0, n], 0 at p = 0 and n at p = 1', () => {
    const random = replicateStream(3, 0)
    fc.assert(fc.property(fc.integer({ min: 0, max: 5000 }), fc.double({ min: 0, max: 1, noNaN: true }), (trials, probability) => {
      const value = sampleBinomial(random, trials, probability)
      return Number.isInteger(value) && value >= 0 && value <= trials
    }))
    expect(sampleBinomial(random, 17, 0)).toBe(0)
    expect(sampleBinomial(random, 17, 1)).toBe(17)
    expect(sampleBinomial(random, 0, 0.5)).toBe(0)
  })

  it('draws bit for bit the same with a stored setup as without', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 5000 }), fc.double({ min: 1e-9, max: 0.5, noNaN: true }), fc.nat(1000), (trials, probability, seed) => {
      const setup = new Float64Array(BINOMIAL_SETUP_SIZE + 3)
      binomialSetup(trials, probability, setup, 3)
      const direct = replicateStream(seed, 0)
      const stored = replicateStream(seed, 0)
      for (let i = 0; i < 5; i++) {
        if (binomialDraw(direct, trials, probability) !== binomialWithSetup(stored, trials, probability, setup, 3)) return false
      }
      return true
    }))
  })

  it('draws the same from a stored inversion pmf table as from the setup', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 5000 }), fc.double({ min: 1e-9, max: 0.5, noNaN: true }), fc.nat(1000), (trials, probability, seed) => {
      const setup = new Float64Array(BINOMIAL_SETUP_SIZE)
      binomialSetup(trials, probability, setup, 0)
      const table = binomialInversionTable(trials, setup, 0)
      if (trials * probability >= 10) return table.length === 0
      const fromSetup = replicateStream(seed, 0)
      const fromTable = replicateStream(seed, 0)
      for (let i = 0; i < 5; i++) {
        if (binomialWithSetup(fromSetup, trials, probability, setup, 0) !== binomialInversionFromTable(fromTable, table)) return false
      }
      return true
    }))
  })

  it('rejects bad inputs', () => {
    const random = replicateStream(3, 0)
    expect(() => sampleBinomial(random, 2.5, 0.5)).toThrow('sampleBinomial: trials must be an integer ≥ 0, got 2.5')
    expect(() => sampleBinomial(random, 10, 1.5)).toThrow(RangeError)
    expect(() => sampleBinomial(random, 10, Number.NaN)).toThrow(RangeError)
  })
})

describe('samplePoisson', () => {
  for (const mean of [0.5, 4, 30, 1000]) {
    it(`matches the Poisson(${mean}) pmf, mean and variance`, () => {
      const random = replicateStream(11, Math.round(mean * 10))
      const draws = 100_000
      const result = tally(() => samplePoisson(random, mean), draws)
      expect(Math.abs(result.mean - mean)).toBeLessThan(Z_CRITICAL * Math.sqrt(mean / draws))
      expect(Math.abs(result.variance - mean)).toBeLessThan(Z_CRITICAL * mean * Math.sqrt((2 + 1 / mean) / draws))
      let logFactorialSum = 0
      const logFactorials: number[] = [0]
      const top = Math.ceil(mean + 12 * Math.sqrt(mean) + 12)
      for (let k = 1; k <= top; k++) {
        logFactorialSum += Math.log(k)
        logFactorials.push(logFactorialSum)
      }
      const pmf = (k: number): number => Math.exp(-mean + k * Math.log(mean) - (logFactorials[k] ?? Infinity))
      const { statistic, critical } = chiSquare(result.counts, pmf, range(0, top), draws)
      expect(statistic).toBeLessThan(critical)
    })
  }

  it('returns 0 for mean 0 and rejects negative means', () => {
    expect(samplePoisson(replicateStream(1, 0), 0)).toBe(0)
    expect(() => samplePoisson(replicateStream(1, 0), -1)).toThrow('samplePoisson: mean must be a finite number ≥ 0, got -1')
  })
})

describe('sampleStandardNormal', () => {
  it('has mean 0, variance 1 and 95 % of draws within ±1.96', () => {
    const random = replicateStream(5, 0)
    const draws = 200_000
    let inside = 0
    const { mean, variance } = tally(() => {
      const value = sampleStandardNormal(random)
      if (Math.abs(value) < 1.959963984540054) inside++
      return value
    }, draws)
    expect(Math.abs(mean)).toBeLessThan(Z_CRITICAL * Math.sqrt(1 / draws))
    expect(Math.abs(variance - 1)).toBeLessThan(Z_CRITICAL * Math.sqrt(2 / draws))
    expect(Math.abs(inside / draws - 0.95)).toBeLessThan(Z_CRITICAL * Math.sqrt(0.95 * 0.05 / draws))
  })
})

describe('sampleGamma', () => {
  for (const shape of [0.3, 1, 5]) {
    it(`has mean kθ and variance kθ² at shape ${shape}`, () => {
      const random = replicateStream(6, shape * 10)
      const scale = 0.02
      const draws = 200_000
      const { mean, variance } = tally(() => sampleGamma(random, shape, scale), draws)
      const theoryMean = shape * scale
      const theoryVariance = shape * scale * scale
      // Gamma excess kurtosis is 6/k.
      expect(Math.abs(mean - theoryMean)).toBeLessThan(Z_CRITICAL * Math.sqrt(theoryVariance / draws))
      expect(Math.abs(variance - theoryVariance)).toBeLessThan(Z_CRITICAL * theoryVariance * Math.sqrt((2 + 6 / shape) / draws))
    })
  }

  it('follows the Erlang(5) distribution function (Kolmogorov–Smirnov)', () => {
    const random = replicateStream(6, 99)
    const draws = 50_000
    const values = Float64Array.from({ length: draws }, () => sampleGamma(random, 5)).sort()
    const erlangCdf = (x: number): number => {
      let term = 1
      let sum = 1
      for (let i = 1; i < 5; i++) {
        term *= x / i
        sum += term
      }
      return 1 - Math.exp(-x) * sum
    }
    let distance = 0
    values.forEach((value, i) => {
      const cdf = erlangCdf(value)
      distance = Math.max(distance, Math.abs(cdf - i / draws), Math.abs(cdf - (i + 1) / draws))
    })
    // KS critical value at α = 10⁻⁴: √(−ln(α/2)/2)/√n.
    expect(distance).toBeLessThan(Math.sqrt(-Math.log(0.5e-4) / 2) / Math.sqrt(draws))
  })

  it('rejects non-positive shape', () => {
    expect(() => sampleGamma(replicateStream(1, 0), 0)).toThrow('sampleGamma: shape must be a finite number > 0, got 0')
  })
})

describe('sampleMultinomial', () => {
  it('sums to n with mean n·p_i per category', () => {
    const random = replicateStream(8, 0)
    const probabilities = [0.1, 0, 0.6, 0.3]
    const trials = 50
    const draws = 20_000
    const sums = [0, 0, 0, 0]
    let wrongTotals = 0
    for (let i = 0; i < draws; i++) {
      const counts = sampleMultinomial(random, trials, probabilities)
      if (counts.reduce((a, b) => a + b, 0) !== trials) wrongTotals++
      counts.forEach((count, j) => {
        sums[j] = (sums[j] ?? 0) + count
      })
    }
    expect(wrongTotals).toBe(0)
    probabilities.forEach((probability, j) => {
      const mean = (sums[j] ?? 0) / draws
      const sd = Math.sqrt(trials * probability * (1 - probability) / draws)
      expect(Math.abs(mean - trials * probability)).toBeLessThanOrEqual(Z_CRITICAL * sd)
    })
  })

  it('handles zero trials and rejects all-zero weights', () => {
    expect(Array.from(sampleMultinomial(replicateStream(1, 0), 0, [0.5, 0.5]))).toEqual([0, 0])
    expect(() => sampleMultinomial(replicateStream(1, 0), 3, [0, 0])).toThrow(RangeError)
  })
})

describe('WeightedSampler', () => {
  it('draws indices in proportion to their weights and never a zero weight', () => {
    const weights = [1, 0, 3, 0.5, 5.5]
    const total = 10
    const sampler = new WeightedSampler(weights)
    const random: RandomStream = replicateStream(12, 0)
    const draws = 100_000
    const { counts } = tally(() => sampler.sample(random), draws)
    expect(counts.get(1) ?? 0).toBe(0)
    const support = [0, 2, 3, 4]
    const { statistic, critical } = chiSquare(counts, k => (weights[k] ?? 0) / total, support, draws)
    expect(statistic).toBeLessThan(critical)
  })

  it('rejects negative or all-zero weights', () => {
    expect(() => new WeightedSampler([1, -1])).toThrow(RangeError)
    expect(() => new WeightedSampler([0, 0])).toThrow(RangeError)
  })
})

describe('logFactorial', () => {
  for (const { k, expected } of fixture.logFactorial) {
    it(`ln ${k}! agrees with mpmath`, () => {
      expect(Math.abs(logFactorial(k) - expected)).toBeLessThanOrEqual(fixture.tolerance.relative * Math.max(1, expected))
    })
  }

  it('rejects non-integers', () => {
    expect(() => logFactorial(1.5)).toThrow('logFactorial: k must be an integer ≥ 0, got 1.5')
  })
})
