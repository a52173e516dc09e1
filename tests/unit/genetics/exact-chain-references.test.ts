/**
 * Exact Wright–Fisher chain against independent reference computations:
 * - exact rational arithmetic for census 1–3 (every start, nine (s, h) sets
 *   including under- and overdominance);
 * - a dense, untruncated extended-precision (float128) state reduction with
 *   40-digit mpmath binomial rows for census 5–1000, down to u ≈ 10⁻²⁸⁵.
 * Sources: the "source" field of each fixture and the scripts in
 * tests/fixtures/genetics/reference/.
 */
import { describe, expect, it } from 'vitest'
import { exactConditionalFixationTimes, exactFixationProbabilities } from '../../../shared/genetics/exact'
import rational from '../../fixtures/genetics/exact-chain-rational.json'
import extended from '../../fixtures/genetics/exact-chain-extended.json'

interface Input { census: number, s: number, h: number, copies: number }

function relativeError(actual: number | undefined, expected: number): number {
  return Math.abs((actual ?? Number.NaN) - expected) / Math.abs(expected)
}

describe('exact chain vs exact rational arithmetic (census 1–3)', () => {
  const tolerance = rational.tolerance.relative
  it('records its source and covers every start', () => {
    expect(rational.source).toMatch(/fractions\.Fraction/)
    expect(rational.cases.length).toBe(9 * (1 + 3 + 5))
  })
  it.each(rational.cases.map(c => [`N=${c.input.census} s=${c.input.s} h=${c.input.h} k=${c.input.copies}`, c] as const))(
    '%s', (_label, { input, fixationProbability, fixationProbabilityExact, conditionalFixationTime }) => {
      const { census, s, h, copies } = input as Input
      const u = exactFixationProbabilities({ census, s, h })[copies]
      const time = exactConditionalFixationTimes({ census, s, h })[copies]
      expect(relativeError(u, fixationProbability), `u = ${u}, exact ${fixationProbabilityExact}`).toBeLessThanOrEqual(tolerance)
      expect(relativeError(time, conditionalFixationTime), `t = ${time}`).toBeLessThanOrEqual(tolerance)
    }, 60_000)
})

describe('exact chain vs dense extended-precision state reduction (census 5–1000)', () => {
  const tolerance = extended.tolerance.relative
  const solved = new Map<string, { u: Float64Array, t: Float64Array | undefined }>()
  const solve = ({ census, s, h }: Input, withTime: boolean) => {
    const key = `${census} ${s} ${h}`
    const entry = solved.get(key) ?? { u: exactFixationProbabilities({ census, s, h }), t: undefined }
    if (withTime && !entry.t) entry.t = exactConditionalFixationTimes({ census, s, h })
    solved.set(key, entry)
    return entry
  }
  it('records its source', () => {
    expect(extended.source).toMatch(/float128/)
  })
  it.each(extended.cases.map(c => [`${c.quantity} N=${c.input.census} s=${c.input.s} h=${c.input.h} k=${c.input.copies} → ${c.expected}`, c] as const))(
    '%s', (_label, { quantity, input, expected }) => {
      const { u, t } = solve(input, quantity === 'conditionalFixationTime')
      const actual = quantity === 'fixationProbability' ? u[input.copies] : t?.[input.copies]
      expect(relativeError(actual, Number(expected)), `got ${actual}`).toBeLessThanOrEqual(tolerance)
    }, 60_000)
})
