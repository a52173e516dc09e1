/**
 * Exact Wright–Fisher chain against the check values printed in SCIENCE.md
 * (§2.3 exact WF column, §3.3 exact-chain column, §11 rows 16–21, 25, 27, 31).
 * Source and tolerances: tests/fixtures/genetics/exact-chain-science.json.
 */
import { describe, expect, it } from 'vitest'
import { exactConditionalFixationTimes, exactFixationProbabilities } from '../../../shared/genetics/exact'
import fixture from '../../fixtures/genetics/exact-chain-science.json'

interface ScienceCase {
  quantity: 'fixationProbability' | 'conditionalFixationTime'
  input: { census: number, s: number, h: number, copies: number }
  expected: number
  printed: string
  where: string
  tolerance: { relative?: number, absolute?: number }
}

const cases = fixture.cases as ScienceCase[]

// One solve per parameter set: the vector functions return every start.
const solved = new Map<string, Float64Array>()
function solve(quantity: ScienceCase['quantity'], { census, s, h }: ScienceCase['input']): Float64Array {
  const key = `${quantity} ${census} ${s} ${h}`
  let vector = solved.get(key)
  if (!vector) {
    vector = quantity === 'fixationProbability'
      ? exactFixationProbabilities({ census, s, h })
      : exactConditionalFixationTimes({ census, s, h })
    solved.set(key, vector)
  }
  return vector
}

describe('exact chain reproduces the SCIENCE.md exact-chain check values', () => {
  it('has its source recorded', () => {
    expect(fixture.source).toMatch(/SCIENCE\.md/)
    expect(cases.length).toBeGreaterThan(40)
  })
  it.each(cases.map(c => [`${c.where}: ${c.quantity} N=${c.input.census} s=${c.input.s} h=${c.input.h} k=${c.input.copies} → ${c.printed}`, c] as const))(
    '%s', (_label, testCase) => {
      const actual = solve(testCase.quantity, testCase.input)[testCase.input.copies]
      expect(actual).toBeDefined()
      const error = Math.abs((actual ?? Number.NaN) - testCase.expected)
      const allowed = testCase.tolerance.relative !== undefined
        ? testCase.tolerance.relative * Math.abs(testCase.expected)
        : testCase.tolerance.absolute ?? 0
      expect(error, `got ${actual}, expected ${testCase.printed}`).toBeLessThanOrEqual(allowed)
    }, 60_000)
})
