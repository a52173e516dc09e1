/**
 * Properties of the exact Wright–Fisher chain that must hold for every input
 * (fast-check), plus the neutral identity u = p and the domain errors.
 * Tolerances are a few hundred ulps: the solver only adds positive numbers.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  exactConditionalFixationTime, exactConditionalFixationTimes, exactFixationProbabilities, exactFixationProbability,
} from '../../../shared/genetics/exact'

const RELATIVE = 1e-12

/** (s, h) with positive fitnesses: 1 + s > 0 and 1 + h·s > 0. */
const selection = fc.record({
  s: fc.double({ min: -0.95, max: 3, noNaN: true }),
  h: fc.double({ min: -1, max: 2, noNaN: true }),
}).filter(({ s, h }) => 1 + h * s > 0.01)
const census = fc.integer({ min: 1, max: 40 })

describe('exact chain: properties', () => {
  it('u is in [0, 1], never NaN, u_0 = 0, u_2N = 1 and u is non-decreasing in copies', () => {
    fc.assert(fc.property(census, selection, (N, { s, h }) => {
      const u = exactFixationProbabilities({ census: N, s, h })
      expect(u.length).toBe(2 * N + 1)
      expect(u[0]).toBe(0)
      expect(u[2 * N]).toBe(1)
      for (let k = 1; k <= 2 * N; k++) {
        const here = u[k] ?? Number.NaN
        const below = u[k - 1] ?? Number.NaN
        expect(here >= 0 && here <= 1, `u[${k}] = ${here}`).toBe(true)
        expect(here).toBeGreaterThanOrEqual(below * (1 - RELATIVE))
      }
    }), { numRuns: 60 })
  })

  it('u is non-decreasing in s when 0 ≤ h ≤ 1 (both A-carrying genotypes gain)', () => {
    const dominance = fc.double({ min: 0, max: 1, noNaN: true })
    const coefficient = fc.double({ min: -0.9, max: 2, noNaN: true })
    fc.assert(fc.property(census, dominance, coefficient, coefficient, (N, h, a, b) => {
      const [low, high] = a <= b ? [a, b] : [b, a]
      const uLow = exactFixationProbabilities({ census: N, s: low, h })
      const uHigh = exactFixationProbabilities({ census: N, s: high, h })
      for (let k = 1; k < 2 * N; k++) expect(uHigh[k] ?? 0).toBeGreaterThanOrEqual((uLow[k] ?? 1) * (1 - RELATIVE))
    }), { numRuns: 40 })
  })

  it('u ≥ p for a favoured allele with 0 ≤ h ≤ 1 (frequency is a submartingale)', () => {
    fc.assert(fc.property(census, fc.double({ min: 1e-6, max: 3, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }),
      (N, s, h) => {
        const u = exactFixationProbabilities({ census: N, s, h })
        for (let k = 1; k < 2 * N; k++) expect(u[k] ?? 0).toBeGreaterThanOrEqual(k / (2 * N) * (1 - RELATIVE))
      }), { numRuns: 40 })
  })

  it('relabelling the alleles: u(k; s, h) + u(2N − k; −s/(1+s), 1 − h) = 1', () => {
    fc.assert(fc.property(census, selection.filter(({ s }) => Math.abs(s) > 1e-3), (N, { s, h }) => {
      const forward = exactFixationProbabilities({ census: N, s, h })
      const swapped = exactFixationProbabilities({ census: N, s: -s / (1 + s), h: 1 - h })
      for (let k = 0; k <= 2 * N; k++) {
        expect(Math.abs((forward[k] ?? 0) + (swapped[2 * N - k] ?? 0) - 1)).toBeLessThanOrEqual(1e-12)
      }
    }), { numRuns: 40 })
  })

  it('the conditional time is finite and at least one generation for 0 < k < 2N', () => {
    fc.assert(fc.property(census, selection.filter(({ s }) => s > -0.5), (N, { s, h }) => {
      const times = exactConditionalFixationTimes({ census: N, s, h })
      expect(times[0]).toBeNaN()
      expect(times[2 * N]).toBe(0)
      for (let k = 1; k < 2 * N; k++) {
        expect(Number.isFinite(times[k]), `t[${k}] = ${times[k]}`).toBe(true)
        expect(times[k] ?? 0).toBeGreaterThanOrEqual(1)
      }
    }), { numRuns: 40 })
  })
})

describe('exact chain: neutral allele', () => {
  // Rounding only: 0 ulps at census 1–2, ~60 ulps at census 1000 (grows with N).
  const NEUTRAL_RELATIVE = 1e-13
  it.each([1, 2, 7, 50, 333, 1000])('u = p for every start at census %i', (N) => {
    for (const h of N < 1000 ? [0, 0.5, 3] : [0.5]) {
      const u = exactFixationProbabilities({ census: N, s: 0, h })
      if (N <= 2) expect(Array.from(u)).toEqual(Array.from({ length: 2 * N + 1 }, (_, k) => k / (2 * N)))
      for (let k = 0; k <= 2 * N; k++) {
        expect(Math.abs((u[k] ?? 0) - k / (2 * N))).toBeLessThanOrEqual(NEUTRAL_RELATIVE * k / (2 * N))
      }
    }
  }, 60_000)
  it('SCIENCE.md §11 row 11 (definition): N = 50, k = 7 → 0.07', () => {
    expect(exactFixationProbability({ census: 50, s: 0, h: 0.5, copies: 7 })).toBeCloseTo(0.07, 14)
  })
  it('census 1: neutral conditional time is exactly 2 generations (p′ = ½, fixation in one step w.p. ¼)', () => {
    // t = Σ_t t·(½)^(t−1)·(¼) / (½) = 2
    expect(exactConditionalFixationTime({ census: 1, s: 0, h: 0.5, copies: 1 })).toBeCloseTo(2, 14)
  })
})

describe('exact chain: edge starts and domain errors', () => {
  it('returns 0 for no copies and 1 (time 0) for a fixed allele', () => {
    expect(exactFixationProbability({ census: 10, s: 0.1, h: 0.5, copies: 0 })).toBe(0)
    expect(exactFixationProbability({ census: 10, s: 0.1, h: 0.5, copies: 20 })).toBe(1)
    expect(exactConditionalFixationTime({ census: 10, s: 0.1, h: 0.5, copies: 20 })).toBe(0)
  })
  it.each([
    [{ census: 0, s: 0.1, h: 0.5, copies: 1 }, 'exactFixationProbability: census must be an integer ≥ 1, got 0'],
    [{ census: 2.5, s: 0.1, h: 0.5, copies: 1 }, 'exactFixationProbability: census must be an integer ≥ 1, got 2.5'],
    [{ census: 5001, s: 0.1, h: 0.5, copies: 1 }, 'exactFixationProbability: census must be an integer ≤ 5000, got 5001'],
    [{ census: 10, s: -1, h: 0.5, copies: 1 }, 'exactFixationProbability: s must be a finite number with 1 + s > 0, got -1'],
    [{ census: 10, s: Number.NaN, h: 0.5, copies: 1 }, 'exactFixationProbability: s must be a finite number, got NaN'],
    [{ census: 10, s: 0.5, h: -2, copies: 1 }, 'exactFixationProbability: h must be a finite number with 1 + h·s > 0, got -2'],
    [{ census: 10, s: 0.5, h: Number.POSITIVE_INFINITY, copies: 1 }, 'exactFixationProbability: h must be a finite number, got Infinity'],
    [{ census: 10, s: 0.1, h: 0.5, copies: 21 }, 'exactFixationProbability: copies must be an integer in [0, 20], got 21'],
    [{ census: 10, s: 0.1, h: 0.5, copies: -1 }, 'exactFixationProbability: copies must be an integer in [0, 20], got -1'],
    [{ census: 10, s: 0.1, h: 0.5, copies: 1.5 }, 'exactFixationProbability: copies must be an integer in [0, 20], got 1.5'],
  ])('rejects %o', (input, message) => {
    expect(() => exactFixationProbability(input)).toThrow(new RangeError(message))
  })
  it('rejects bad input to the vector and time functions with their own names', () => {
    expect(() => exactFixationProbabilities({ census: -3, s: 0, h: 0 })).toThrow(RangeError)
    expect(() => exactFixationProbabilities({ census: -3, s: 0, h: 0 })).toThrow(/^exactFixationProbabilities: census/)
    expect(() => exactConditionalFixationTimes({ census: 3, s: -2, h: 0 })).toThrow(/^exactConditionalFixationTimes: s/)
    expect(() => exactConditionalFixationTime({ census: 3, s: 0.1, h: 0.5, copies: 0 }))
      .toThrow(new RangeError('exactConditionalFixationTime: copies must be an integer in [1, 6], got 0'))
  })
})
