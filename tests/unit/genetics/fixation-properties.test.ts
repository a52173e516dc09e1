/**
 * Property tests for the diffusion fixation probability: limits, monotonicity,
 * the allele-relabelling identity, and "never NaN or Infinity" over the whole
 * domain including extremes.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { fixationProbability, log10FixationProbability } from '../../../shared/genetics/fixation'
import type { FixationInputs } from '../../../shared/genetics/fixation'

/** A census size, effective size and copy number; Ne/N from 10⁻³ to 3. */
const population = fc.record({
  census: fc.oneof(fc.integer({ min: 1, max: 20 }), fc.integer({ min: 1, max: 1_000_000 })),
  ratio: fc.double({ min: 1e-3, max: 3, noNaN: true }),
  copyFraction: fc.double({ min: 0, max: 1, noNaN: true }),
}).map(({ census, ratio, copyFraction }) => ({
  census,
  effectiveSize: Math.max(census * ratio, 1e-3),
  copies: Math.round(copyFraction * 2 * census),
}))

/** s across the domain: near-neutral, weak, strong, strongly deleterious. */
const selection = fc.oneof(
  fc.double({ min: -1e-9, max: 1e-9, noNaN: true }),
  fc.double({ min: -0.1, max: 0.1, noNaN: true }),
  fc.double({ min: -0.999, max: 5, noNaN: true }),
)

/** Any dominance, then checked against 1 + h·s > 0 by the caller. */
const dominance = fc.oneof(
  fc.constantFrom(0, 0.25, 0.5, 1),
  fc.double({ min: -3, max: 4, noNaN: true }),
)

const domain = fc.tuple(population, selection, dominance)
  .map(([pop, s, h]) => ({ ...pop, s, h }))
  .filter(({ s, h }) => 1 + s > 0 && 1 + h * s > 0)

describe('fixationProbability properties', () => {
  it('is a probability, never NaN or Infinity, and log10 is finite for copies ≥ 1', () => {
    fc.assert(fc.property(domain, (inputs) => {
      const u = fixationProbability(inputs)
      expect(Number.isFinite(u)).toBe(true)
      expect(u).toBeGreaterThanOrEqual(0)
      expect(u).toBeLessThanOrEqual(1)
      const log10u = log10FixationProbability(inputs)
      if (inputs.copies === 0) expect(log10u).toBe(-Infinity)
      else {
        expect(Number.isFinite(log10u)).toBe(true)
        expect(log10u).toBeLessThanOrEqual(0)
        // u and log10 u describe the same number wherever u is representable.
        if (u > 1e-300) expect(Math.abs(Math.log10(u) - log10u)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(log10u)))
      }
    }), { numRuns: 3000 })
  })

  it('stays finite at the extremes |2·Ne·s| = 10⁶ for every dominance', () => {
    fc.assert(fc.property(
      fc.constantFrom(-0.5, 0.5),
      fc.double({ min: -0.9, max: 1.9, noNaN: true }),
      fc.integer({ min: 1, max: 1_999_999 }),
      (s, h, copies) => {
        const inputs = { census: 1_000_000, effectiveSize: 1_000_000, s, h, copies }
        expect(Number.isFinite(fixationProbability(inputs))).toBe(true)
        expect(Number.isFinite(log10FixationProbability(inputs))).toBe(true)
      },
    ), { numRuns: 500 })
  })

  it('tends to p = k/(2N) as s → 0', () => {
    fc.assert(fc.property(domain, fc.double({ min: -1e-7, max: 1e-7, noNaN: true }), (inputs, tinyScaled) => {
      if (inputs.copies === 0) return
      // s chosen so that |2·Ne·s|·(1 + 2|h|) ≤ 10⁻⁷
      const s = tinyScaled / (2 * inputs.effectiveSize * (1 + 2 * Math.abs(inputs.h)))
      const p = inputs.copies / (2 * inputs.census)
      const u = fixationProbability({ ...inputs, s })
      expect(Math.abs(u - p)).toBeLessThanOrEqual(2e-7 * p + 1e-16)
    }), { numRuns: 2000 })
  })

  it('increases with the number of copies', () => {
    fc.assert(fc.property(domain, (inputs) => {
      if (inputs.copies >= 2 * inputs.census) return
      const more = { ...inputs, copies: inputs.copies + 1 }
      const before = log10FixationProbability(inputs)
      const after = log10FixationProbability(more)
      // Never decreases beyond rounding. Near u = 1 (or at a deep trough of G)
      // one more copy can change u by less than an ulp; with 0 ≤ h ≤ 1 and
      // u < ½ the change is at least a factor 1 + 1/(2N), so it must show.
      expect(after).toBeGreaterThanOrEqual(before - 1e-13 * Math.max(1, Math.abs(before)))
      if (inputs.h >= 0 && inputs.h <= 1 && before < Math.log10(0.5)) expect(after).toBeGreaterThan(before)
    }), { numRuns: 2000 })
  })

  it('increases with s when 0 ≤ h ≤ 1', () => {
    const ordered = fc.tuple(population, fc.double({ min: 0, max: 1, noNaN: true }), selection, selection)
      .filter(([pop, , first, second]) => first !== second && pop.copies > 0 && pop.copies < 2 * pop.census
        && 1 + Math.min(first, second) > 0)
    fc.assert(fc.property(ordered, ([pop, h, first, second]) => {
      const low = Math.min(first, second)
      const high = Math.max(first, second)
      const uLow = log10FixationProbability({ ...pop, h, s: low })
      const uHigh = log10FixationProbability({ ...pop, h, s: high })
      // Allow for rounding when the two s values are nearly equal.
      expect(uHigh).toBeGreaterThanOrEqual(uLow - 1e-12 * Math.max(1, Math.abs(uLow)))
    }), { numRuns: 2000 })
  })

  it('is at least p for a favoured allele with 0 ≤ h ≤ 1 (and at most p for a harmful one)', () => {
    fc.assert(fc.property(population, fc.double({ min: 0, max: 1, noNaN: true }), selection, (pop, h, s) => {
      if (pop.copies === 0 || !(1 + s > 0)) return
      const p = pop.copies / (2 * pop.census)
      const u = fixationProbability({ ...pop, h, s })
      if (s > 0) expect(u).toBeGreaterThanOrEqual(p * (1 - 1e-13))
      if (s < 0) expect(u).toBeLessThanOrEqual(p * (1 + 1e-13))
    }), { numRuns: 2000 })
  })

  // Each side is right to about 1e-13 plus the rounding of the exponent 2·Ne·s·(2h·x + (1 − 2h)·x²),
  // about ε·|2·Ne·s| relative (random seeds found sums off by 1.5e-12 at |2·Ne·s| = 1.6×10⁴ and
  // 1.0e-11 at 1.3×10⁵), hence the tolerance 1e-12 + 8·ε·|2·Ne·s|.
  it('satisfies u_A(p; s, h) + u_a(1 − p; −s, 1 − h) = 1 (the same process seen from the other allele)', () => {
    const symmetric = domain.filter(({ s, h }) => 1 - s > 0 && 1 - (1 - h) * s > 0)
    fc.assert(fc.property(symmetric, (inputs: FixationInputs) => {
      const other = { ...inputs, s: -inputs.s, h: 1 - inputs.h, copies: 2 * inputs.census - inputs.copies }
      const sum = fixationProbability(inputs) + fixationProbability(other)
      expect(Math.abs(sum - 1)).toBeLessThanOrEqual(1e-12 + 8 * Number.EPSILON * Math.abs(2 * inputs.effectiveSize * inputs.s))
    }), { numRuns: 2000 })
  })

  it('keeps the relabelled side within 2e-12 where the density peaks just inside p, near 1 (|2·Ne·s| ≈ 1.6×10⁴)', () => {
    // Found by the property above with a random seed. Reference: independent mpmath
    // computation (mpmath 1.3, 40 digits, quad with breakpoints 0, x*, p, 1 on the exact
    // IEEE inputs): u_A = 6.6914800631240396e-4, u_a = 0.99933085199368760672 (nearest doubles below).
    const inputs = { census: 107507, effectiveSize: 89867.46998564518, copies: 1, s: 0.09118410117554383, h: -0.00002794235135683554 }
    const other = { ...inputs, s: -inputs.s, h: 1 - inputs.h, copies: 2 * inputs.census - 1 }
    expect(Math.abs(fixationProbability(inputs) / 6.69148006312404e-4 - 1)).toBeLessThanOrEqual(1e-13)
    expect(Math.abs(fixationProbability(other) - 0.9993308519936877)).toBeLessThanOrEqual(2e-12)
  })
})

describe('fixationProbability domain errors (properties)', () => {
  it('throws a RangeError naming s whenever 1 + s ≤ 0', () => {
    fc.assert(fc.property(fc.double({ min: -1e6, max: -1, noNaN: true }), (s) => {
      expect(() => fixationProbability({ census: 10, effectiveSize: 10, s, h: 0.5, copies: 1 }))
        .toThrow(/^fixationProbability: s must be such that 1 \+ s > 0/)
    }))
  })

  it('throws a RangeError naming h whenever 1 + h·s ≤ 0', () => {
    fc.assert(fc.property(fc.double({ min: 0.01, max: 10, noNaN: true }), fc.double({ min: 1.000001, max: 100, noNaN: true }), (s, factor) => {
      // h·s = −factor < −1 (factor kept above 1 so rounding cannot bring 1 + h·s back above 0)
      const h = -factor / s
      expect(() => fixationProbability({ census: 10, effectiveSize: 10, s, h, copies: 1 }))
        .toThrow(/^fixationProbability: h must be such that 1 \+ h·s > 0/)
    }))
  })

  it('throws a RangeError naming copies outside 0 … 2N', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 1000 }), fc.integer({ min: 1, max: 1000 }), (census, excess) => {
      expect(() => fixationProbability({ census, effectiveSize: census, s: 0.01, h: 0.5, copies: 2 * census + excess }))
        .toThrow(`fixationProbability: copies must be at most 2·census = ${2 * census}, got ${2 * census + excess}`)
    }))
  })
})
