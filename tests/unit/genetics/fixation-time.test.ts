/**
 * Conditional mean time to fixation (Kimura & Ohta 1969): SCIENCE.md §3.2,
 * §3.3 and §11 values, the mpmath references of
 * tests/fixtures/genetics/reference/fixation_reference.py, rules of thumb,
 * properties and domain errors.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { conditionalFixationTime } from '../../../shared/genetics/fixation'
import type { FixationInputs } from '../../../shared/genetics/fixation'
import scienceValues from '../../fixtures/genetics/fixation-time-science-check-values.json'
import mpmathReference from '../../fixtures/genetics/fixation-time-mpmath-reference.json'
import rulesOfThumb from '../../fixtures/genetics/fixation-rules-of-thumb.json'

function inputsOf(row: FixationInputs): FixationInputs {
  return { census: row.census, effectiveSize: row.effectiveSize, s: row.s, h: row.h, copies: row.copies }
}

function describeInputs(row: FixationInputs): string {
  return `N=${row.census} Ne=${row.effectiveSize} s=${row.s} h=${row.h} k=${row.copies}`
}

describe('conditionalFixationTime: SCIENCE.md §3.2, §3.3 and §11 values', () => {
  for (const row of scienceValues.cases) {
    it(`${row.where}: ${describeInputs(row)} → ${row.printed}`, () => {
      const time = conditionalFixationTime(inputsOf(row))
      const tolerance: { absolute?: number, relative?: number } = row.tolerance
      const allowed = tolerance.absolute ?? (tolerance.relative ?? 0) * row.generations
      expect(Math.abs(time - row.generations), `t = ${time}`).toBeLessThanOrEqual(allowed)
    })
  }
})

describe('conditionalFixationTime: mpmath references', () => {
  for (const row of mpmathReference.cases) {
    it(`${describeInputs(row)} → ${row.generations}`, () => {
      const time = conditionalFixationTime(inputsOf(row))
      expect(Math.abs(time / row.generations - 1), `t = ${time}`).toBeLessThanOrEqual(mpmathReference.tolerance.relative)
    })
  }
})

describe('conditionalFixationTime: rules of thumb (common practice, no source)', () => {
  for (const row of rulesOfThumb.neutralTime) {
    it(row.rule, () => {
      const time = conditionalFixationTime(inputsOf(row))
      expect(Math.abs(time / row.expected - 1)).toBeLessThanOrEqual(row.relativeTolerance)
    })
  }
  for (const row of rulesOfThumb.favouredFixesFaster) {
    it(`${row.rule}: h = ${row.h}`, () => {
      const neutral = conditionalFixationTime({ ...row, s: 0 })
      let previous = neutral
      for (const s of row.s) {
        const time = conditionalFixationTime({ ...row, s })
        expect(time).toBeLessThan(previous)
        previous = time
      }
    })
  }

  it('has the documented exception: a weakly favoured dominant allele fixes more slowly than a neutral one (§3.3: 419.818 vs 398.998)', () => {
    const base = { census: 100, effectiveSize: 100, h: 1, copies: 1 }
    expect(conditionalFixationTime({ ...base, s: 0.01 })).toBeGreaterThan(conditionalFixationTime({ ...base, s: 0 }))
  })
})

describe('conditionalFixationTime: special cases and properties', () => {
  it('is 0 when the allele starts fixed', () => {
    expect(conditionalFixationTime({ census: 100, effectiveSize: 100, s: 0.01, h: 0.5, copies: 200 })).toBe(0)
  })

  it('follows the neutral closed form −4Ne(1−p)ln(1−p)/p as s → 0', () => {
    fc.assert(fc.property(
      fc.integer({ min: 1, max: 2000 }), fc.double({ min: 0.1, max: 2, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }),
      (census, ratio, fraction) => {
        const effectiveSize = census * ratio
        const copies = Math.max(1, Math.min(2 * census - 1, Math.round(fraction * 2 * census)))
        if (copies >= 2 * census) return
        const p = copies / (2 * census)
        const neutral = (-4 * effectiveSize * (1 - p) * Math.log1p(-p)) / p
        const nearlyNeutral = conditionalFixationTime({ census, effectiveSize, s: 1e-10 / effectiveSize, h: 0.3, copies })
        expect(Math.abs(nearlyNeutral / neutral - 1)).toBeLessThanOrEqual(1e-8)
      },
    ), { numRuns: 200 })
  })

  it('is the same for an additive allele and its harmful mirror image (s → −s, h = ½)', () => {
    fc.assert(fc.property(
      fc.integer({ min: 5, max: 2000 }), fc.double({ min: 1e-4, max: 0.3, noNaN: true }), fc.integer({ min: 1, max: 9 }),
      (census, s, copies) => {
        const base = { census, effectiveSize: census, h: 0.5, copies: Math.min(copies, 2 * census - 1) }
        const favoured = conditionalFixationTime({ ...base, s })
        const harmful = conditionalFixationTime({ ...base, s: -s })
        expect(Math.abs(harmful / favoured - 1)).toBeLessThanOrEqual(1e-8)
      },
    ), { numRuns: 100 })
  })

  it('is positive across the domain, and finite unless overdominance holds the allele at a balanced polymorphism', () => {
    fc.assert(fc.property(
      fc.integer({ min: 1, max: 5000 }), fc.double({ min: 0.05, max: 2, noNaN: true }),
      fc.double({ min: -0.3, max: 1, noNaN: true }), fc.double({ min: -1, max: 2, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }),
      (census, ratio, s, h, fraction) => {
        if (!(1 + h * s > 0)) return
        const copies = Math.max(1, Math.min(2 * census - 1, Math.round(fraction * 2 * census)))
        if (copies >= 2 * census) return
        const time = conditionalFixationTime({ census, effectiveSize: census * ratio, s, h, copies })
        expect(Number.isNaN(time)).toBe(false)
        expect(time).toBeGreaterThan(0)
        if (h >= 0 && h <= 1) expect(Number.isFinite(time)).toBe(true)
      },
    ), { numRuns: 150 })
  })

  it('rejects copies = 0 (nothing to condition on) and other invalid inputs', () => {
    expect(() => conditionalFixationTime({ census: 100, effectiveSize: 100, s: 0.01, h: 0.5, copies: 0 }))
      .toThrow('conditionalFixationTime: copies must be an integer ≥ 1, got 0')
    expect(() => conditionalFixationTime({ census: 100, effectiveSize: -1, s: 0.01, h: 0.5, copies: 1 }))
      .toThrow('conditionalFixationTime: effectiveSize must be a finite number > 0, got -1')
    expect(() => conditionalFixationTime({ census: 100, effectiveSize: 100, s: -2, h: 0.5, copies: 1 }))
      .toThrow(RangeError)
  })
})
