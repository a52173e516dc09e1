/**
 * The copies distribution and the truncated log-space mixture (shared/proposals/copies.ts):
 * the truncated sum equals the full direct summation over every j, also where the summand
 * spans hundreds of orders of magnitude (deleterious variants).
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { log10FixationProbability } from '#shared/genetics'
import { binomialLogProbability, combineReleases, copiesDistribution, logMixture } from '#shared/proposals/copies'

/** Full direct summation in log space over j = 1 … n (no truncation). */
function fullLogSum(n: number, q: number, logValue: (j: number) => number): number {
  const logs: number[] = []
  for (let j = 1; j <= n; j++) logs.push(binomialLogProbability(n, j, q) + logValue(j))
  const finite = logs.filter(Number.isFinite)
  const top = Math.max(...finite)
  return top + Math.log(finite.reduce((sum, value) => sum + Math.exp(value - top), 0))
}

describe('binomialLogProbability', () => {
  it('matches the binomial probabilities of a small case computed by hand', () => {
    // Binomial(4, 0.25): 81/256, 108/256, 54/256, 12/256, 1/256.
    const expected = [81, 108, 54, 12, 1].map(count => count / 256)
    expected.forEach((probability, j) => {
      expect(Math.exp(binomialLogProbability(4, j, 0.25))).toBeCloseTo(probability, 15)
    })
  })

  it('handles q = 1', () => {
    expect(binomialLogProbability(6, 6, 1)).toBe(0)
    expect(binomialLogProbability(6, 5, 1)).toBe(Number.NEGATIVE_INFINITY)
  })
})

describe('copiesDistribution', () => {
  it('one animal at q = 0.5: P(0) = 0.25, P(1) = 0.5, P(2) = 0.25, mean 1', () => {
    const distribution = copiesDistribution(1, 0.5)
    expect(distribution.probabilityNone).toBeCloseTo(0.25, 15)
    expect(distribution.terms).toEqual([{ copies: 1, probability: expect.closeTo(0.5, 15) }, { copies: 2, probability: expect.closeTo(0.25, 15) }])
    expect(distribution.mean).toBe(1)
  })

  it('probabilities shown plus P(0) add to 1 within the display cut-off', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 200 }), fc.double({ min: 0.001, max: 1, noNaN: true }), (animals, q) => {
      const distribution = copiesDistribution(animals, q)
      const total = distribution.probabilityNone + distribution.terms.reduce((sum, term) => sum + term.probability, 0)
      expect(Math.abs(total - 1)).toBeLessThan(1e-12)
    }), { numRuns: 200 })
  })
})

describe('logMixture', () => {
  it('equals the full direct summation for fixation probabilities (property)', () => {
    fc.assert(fc.property(
      fc.integer({ min: 1, max: 40 }),
      fc.double({ min: 0.01, max: 1, noNaN: true }),
      fc.double({ min: -0.2, max: 0.3, noNaN: true }),
      fc.constantFrom(0, 0.25, 0.5, 1),
      fc.integer({ min: 5, max: 400 }),
      (animals, q, s, h, effectiveSize) => {
        const census = 400
        const logValue = (copies: number) => log10FixationProbability({ census: census + animals, effectiveSize, s, h, copies }) * Math.LN10
        const truncated = logMixture(2 * animals, q, logValue).logSum
        const full = fullLogSum(2 * animals, q, logValue)
        expect(Math.abs(truncated - full)).toBeLessThan(1e-13 * Math.max(1, Math.abs(full)))
      },
    ), { numRuns: 150 })
  })

  it('keeps the upper tail when the summand grows steeply (strongly deleterious variant)', () => {
    const animals = 100
    const logValue = (copies: number) => log10FixationProbability({ census: 10_100, effectiveSize: 10_000, s: -0.2, h: 0.5, copies }) * Math.LN10
    const truncated = logMixture(2 * animals, 0.1, logValue)
    const full = fullLogSum(2 * animals, 0.1, logValue)
    expect(Math.abs(truncated.logSum - full)).toBeLessThan(1e-12 * Math.abs(full))
    // The sum reaches far beyond the mode (20 copies) because u grows by orders of magnitude per copy.
    expect(Math.max(...truncated.terms.map(term => term.copies))).toBeGreaterThan(60)
  })

  it('stops early for a flat summand (few terms for a large release)', () => {
    const terms = logMixture(1000, 0.5, () => 0).terms.length
    expect(terms).toBeLessThan(400)
  })
})

describe('combineReleases', () => {
  it('is 1 − (1 − p)^R and stays accurate for tiny p', () => {
    expect(combineReleases(0.1, 3)).toBeCloseTo(1 - 0.9 ** 3, 15)
    expect(combineReleases(1e-20, 5)).toBeCloseTo(5e-20, 33)
    expect(combineReleases(0.3, 0)).toBe(0)
  })
})
