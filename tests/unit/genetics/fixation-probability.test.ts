/**
 * Diffusion fixation probability (shared/genetics/fixation): reference values
 * from SCIENCE.md §1.6/§11 and from the mpmath script in
 * tests/fixtures/genetics/reference/fixation_reference.py, special cases and
 * domain errors. Property tests live in fixation-properties.test.ts.
 */
import { describe, expect, it } from 'vitest'
import { fixationProbability, log10FixationProbability } from '../../../shared/genetics/fixation'
import type { FixationInputs } from '../../../shared/genetics/fixation'
import scienceValues from '../../fixtures/genetics/fixation-science-check-values.json'
import mpmathReference from '../../fixtures/genetics/fixation-mpmath-reference.json'
import approximationValues from '../../fixtures/genetics/fixation-approximation-check-values.json'

function inputsOf(row: FixationInputs): FixationInputs {
  return { census: row.census, effectiveSize: row.effectiveSize, s: row.s, h: row.h, copies: row.copies }
}

function describeInputs(row: FixationInputs): string {
  return `N=${row.census} Ne=${row.effectiveSize} s=${row.s} h=${row.h} k=${row.copies}`
}

function relativeError(actual: number, expected: number): number {
  return Math.abs(actual - expected) / Math.abs(expected)
}

describe('fixationProbability: SCIENCE.md §1.6 and §11 check values', () => {
  const { tolerance } = scienceValues
  for (const row of scienceValues.cases) {
    const inputs = inputsOf(row)
    it(`${row.table}: ${describeInputs(inputs)}`, () => {
      const u = fixationProbability(inputs)
      const log10u = log10FixationProbability(inputs)
      if (row.u > 0) {
        expect(relativeError(u, row.u), `u = ${u}`).toBeLessThanOrEqual(tolerance.relative)
        expect(Math.abs(log10u - Math.log10(row.u))).toBeLessThanOrEqual(tolerance.log10Absolute)
      } else {
        // Underflow rows (u printed as e-8600): only log10 u is representable.
        expect(u).toBe(0)
      }
      if ('log10' in row && typeof row.log10 === 'number') {
        const allowed = row.table.startsWith('§11 row 15') ? tolerance.row15Log10Absolute : tolerance.log10Absolute
        expect(Math.abs(log10u - row.log10), `log10 u = ${log10u}`).toBeLessThanOrEqual(allowed * Math.max(1, Math.abs(row.log10)))
      }
    })
  }
})

describe('fixationProbability: extreme and random cases against 50-digit mpmath', () => {
  const { tolerance } = mpmathReference
  for (const row of mpmathReference.cases) {
    const inputs = inputsOf(row)
    it(describeInputs(inputs), () => {
      const log10u = log10FixationProbability(inputs)
      expect(Number.isFinite(log10u)).toBe(true)
      expect(Math.abs(log10u - row.log10), `log10 u = ${log10u}`).toBeLessThanOrEqual(tolerance.log10Absolute * Math.max(1, Math.abs(row.log10)))
      if (row.u !== null && row.u > 1e-300) {
        const u = fixationProbability(inputs)
        expect(relativeError(u, row.u), `u = ${u}`).toBeLessThanOrEqual(tolerance.relative)
      }
    })
  }
})

describe('fixationProbability: special cases', () => {
  it('is exactly p when s = 0, for any h and Ne (§1.2, §11 row 11)', () => {
    for (const h of [-3, 0, 0.25, 0.5, 1, 7]) {
      expect(fixationProbability({ census: 50, effectiveSize: 5, s: 0, h, copies: 7 })).toBe(0.07)
    }
  })

  it('depends on Ne and s only through Ne·s (§1.1 example)', () => {
    const { first, second, expected, tolerance } = approximationValues.invariance
    const a = fixationProbability(first)
    const b = fixationProbability(second)
    expect(relativeError(a, expected)).toBeLessThanOrEqual(tolerance.relative)
    expect(relativeError(b, expected)).toBeLessThanOrEqual(tolerance.relative)
    expect(relativeError(a, b)).toBeLessThanOrEqual(1e-13)
  })

  it('matches the near-neutral check of §1.5 item 3 (series and exact value)', () => {
    const row = approximationValues.nearNeutral
    const u = fixationProbability(row)
    expect(Math.abs(u - row.series)).toBeLessThanOrEqual(row.seriesTolerance)
    expect(relativeError(u, row.exact)).toBeLessThanOrEqual(row.exactTolerance.relative)
  })

  it('agrees with the additive closed form (1 − e^(−2Ne·s·p))/(1 − e^(−2Ne·s)) (§1.2)', () => {
    for (const [census, effectiveSize, s, copies] of [[100, 100, 0.01, 3], [500, 50, 0.2, 1], [40, 40, -0.05, 9]] as const) {
      const scaled = 2 * effectiveSize * s
      const p = copies / (2 * census)
      const closedForm = Math.expm1(-scaled * p) / Math.expm1(-scaled)
      expect(relativeError(fixationProbability({ census, effectiveSize, s, h: 0.5, copies }), closedForm)).toBeLessThanOrEqual(1e-13)
    }
  })

  it('returns 0 for no copies and 1 when the allele is already fixed', () => {
    const base = { census: 10, effectiveSize: 10, s: 0.1, h: 0.5 }
    expect(fixationProbability({ ...base, copies: 0 })).toBe(0)
    expect(log10FixationProbability({ ...base, copies: 0 })).toBe(-Infinity)
    expect(fixationProbability({ ...base, copies: 20 })).toBe(1)
    expect(log10FixationProbability({ ...base, copies: 20 })).toBe(0)
  })

  it('stays finite in log10 where u underflows (2·Ne·s = −2×10⁶)', () => {
    const inputs = { census: 1_000_000, effectiveSize: 1_000_000, s: -0.99, h: 0.5, copies: 1 }
    expect(fixationProbability(inputs)).toBe(0)
    const log10u = log10FixationProbability(inputs)
    // h = ½: log u = −|c|(1 − p) + log(expm1(|c|p)/…) ≈ −|c|(1 − p) + log(|c|p·…); leading term −|c|/ln 10.
    expect(log10u).toBeLessThan(-859_000)
    expect(log10u).toBeGreaterThan(-860_000)
  })
})

describe('fixationProbability: domain errors', () => {
  const valid = { census: 100, effectiveSize: 100, s: 0.01, h: 0.5, copies: 1 }
  const cases: [Partial<FixationInputs>, string][] = [
    [{ census: 0 }, 'fixationProbability: census must be an integer ≥ 1, got 0'],
    [{ census: 10.5 }, 'fixationProbability: census must be an integer ≥ 1, got 10.5'],
    [{ effectiveSize: 0 }, 'fixationProbability: effectiveSize must be a finite number > 0, got 0'],
    [{ effectiveSize: Number.NaN }, 'fixationProbability: effectiveSize must be a finite number > 0, got NaN'],
    [{ s: -1 }, 'fixationProbability: s must be such that 1 + s > 0 (AA fitness positive), got -1'],
    [{ s: Number.POSITIVE_INFINITY }, 'fixationProbability: s must be a finite number, got Infinity'],
    [{ s: 0.5, h: -2 }, 'fixationProbability: h must be such that 1 + h·s > 0 (Aa fitness positive; s = 0.5), got -2'],
    [{ copies: -1 }, 'fixationProbability: copies must be an integer ≥ 0, got -1'],
    [{ copies: 201 }, 'fixationProbability: copies must be at most 2·census = 200, got 201'],
    [{ copies: 1.5 }, 'fixationProbability: copies must be an integer ≥ 0, got 1.5'],
    [{ effectiveSize: 1e300, s: 0.5 }, 'fixationProbability: s must be such that 2·effectiveSize·|s|·(1 + 2|h|) ≤ 1e+100, got 0.5'],
  ]
  for (const [change, message] of cases) {
    it(message, () => {
      expect(() => fixationProbability({ ...valid, ...change })).toThrow(RangeError)
      expect(() => fixationProbability({ ...valid, ...change })).toThrow(message)
    })
  }

  it('uses its own name in log10FixationProbability messages (s = −1 of §11 row 15 is outside the domain)', () => {
    expect(() => log10FixationProbability({ census: 10000, effectiveSize: 10000, s: -1, h: 0.5, copies: 200 }))
      .toThrow('log10FixationProbability: s must be such that 1 + s > 0 (AA fitness positive), got -1')
  })
})
