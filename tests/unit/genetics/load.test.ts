/**
 * Inbreeding depression and the benefit of gene flow (shared/genetics/load):
 * SCIENCE.md check values, an independent mpmath reference grid, edge cases,
 * domain errors and property tests. Published magnitudes are checked in
 * load-published.test.ts.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  diploidLethalEquivalentsFromFitness,
  fitnessReductionFromInbreeding,
  relativeFitness,
  rescueFitnessRatio,
  secondGenerationCrossInbreeding,
} from '../../../shared/genetics/load'
import scienceValues from '../../fixtures/genetics/load-science-check-values.json'
import referenceGrid from '../../fixtures/genetics/load-reference-grid.json'

const EPS = 2 ** -52

interface Tolerance { relative?: number, absolute?: number }
interface FixtureCase { function: string, input: Record<string, unknown>, expected: number, tolerance: Tolerance, where?: string, offset?: number }

type Call = (input: never) => number
const functions: Record<string, Call> = {
  relativeFitness,
  fitnessReductionFromInbreeding,
  rescueFitnessRatio,
  diploidLethalEquivalentsFromFitness,
  secondGenerationCrossInbreeding,
}

function expectClose(actual: number, expected: number, tolerance: Tolerance, label: string): void {
  const allowed = Math.max(tolerance.absolute ?? 0, (tolerance.relative ?? 0) * Math.abs(expected))
  const error = Math.abs(actual - expected)
  expect(error <= allowed, `${label}: got ${actual}, expected ${expected} ± ${allowed} (error ${error})`).toBe(true)
}

function runCase(testCase: FixtureCase): void {
  const call = functions[testCase.function]
  if (!call) throw new Error(`fixture names an unknown function ${testCase.function}`)
  // `offset` turns a ratio into a printed gain (ratio − 1 = +146%).
  const actual = call(testCase.input as never) - (testCase.offset ?? 0)
  expectClose(actual, testCase.expected, testCase.tolerance, `${testCase.function}(${JSON.stringify(testCase.input)})${testCase.where ? ` [${testCase.where}]` : ''}`)
}

describe('load: SCIENCE.md check values (§6.1, §6.2, §6.4, §11 rows 40–43)', () => {
  it('has a source', () => expect(scienceValues.source).toMatch(/SCIENCE\.md/))
  it.each(scienceValues.cases.map(c => [`${c.function} ${JSON.stringify(c.input)} — ${c.where}`, c] as const))('%s', (_name, testCase) => {
    runCase(testCase as FixtureCase)
  })
})

describe('load: independent mpmath reference grid', () => {
  it('has a source', () => expect(referenceGrid.source).toMatch(/mpmath/))
  const byFunction = new Map<string, FixtureCase[]>()
  for (const testCase of referenceGrid.cases as FixtureCase[]) {
    const list = byFunction.get(testCase.function) ?? []
    list.push(testCase)
    byFunction.set(testCase.function, list)
  }
  for (const [name, cases] of byFunction) {
    it(`${name}: ${cases.length} cases within (k + |B·F|)·eps`, () => {
      for (const testCase of cases) runCase(testCase)
    })
  }
})

describe('load: diploid vs haploid convention (SCIENCE.md §6.1)', () => {
  it('halves the diploid number: 2B = 6 at F = 0.3 is exp(−0.9), not exp(−1.8)', () => {
    expectClose(relativeFitness({ diploidLethalEquivalents: 6, inbreeding: 0.3 }), Math.exp(-0.9), { relative: 4 * EPS }, 'B = 3')
    expect(relativeFitness({ diploidLethalEquivalents: 6, inbreeding: 0.3 })).not.toBeCloseTo(Math.exp(-1.8), 3)
  })
})

describe('load: edge cases', () => {
  it('no inbreeding or no load means no depression', () => {
    expect(relativeFitness({ diploidLethalEquivalents: 12, inbreeding: 0 })).toBe(1)
    expect(relativeFitness({ diploidLethalEquivalents: 0, inbreeding: 1 })).toBe(1)
    expect(Object.is(fitnessReductionFromInbreeding({ diploidLethalEquivalents: 6, inbreeding: 0 }), 0)).toBe(true)
    expect(rescueFitnessRatio({ diploidLethalEquivalents: 6, recipientInbreeding: 0.2, offspringInbreeding: 0.2 })).toBe(1)
    expect(Object.is(diploidLethalEquivalentsFromFitness({ relativeFitness: 1, inbreeding: 0.25 }), 0)).toBe(true)
  })
  it('small losses keep full relative precision (expm1)', () => {
    expectClose(fitnessReductionFromInbreeding({ diploidLethalEquivalents: 2, inbreeding: 1e-12 }), 1e-12, { relative: 1e-11 }, 'B·F = 1e-12')
  })
  it('F1 of a cross is the between-population kinship; F2 regains part of the parents\' inbreeding', () => {
    // SCIENCE.md §6.2: f_AA = 0.3, f_BB = 0.1, f_AB = 0.02 → F1 0.02, F2 0.11.
    const f2 = secondGenerationCrossInbreeding({ kinshipWithinFirst: 0.3, kinshipWithinSecond: 0.1, kinshipBetween: 0.02 })
    expect(f2).toBeGreaterThan(0.02)
    expectClose(f2, 0.11, { relative: 4 * EPS }, 'F2')
  })
})

describe('load: domain errors use the standard RangeError message', () => {
  const cases: [string, () => unknown, string][] = [
    ['negative LE', () => relativeFitness({ diploidLethalEquivalents: -1.4, inbreeding: 0.25 }), 'relativeFitness: diploidLethalEquivalents must be a finite number ≥ 0, got -1.4'],
    ['F above 1', () => relativeFitness({ diploidLethalEquivalents: 3, inbreeding: 1.2 }), 'relativeFitness: inbreeding must be in [0, 1], got 1.2'],
    ['NaN F', () => fitnessReductionFromInbreeding({ diploidLethalEquivalents: 3, inbreeding: Number.NaN }), 'fitnessReductionFromInbreeding: inbreeding must be in [0, 1], got NaN'],
    ['rescue recipient F', () => rescueFitnessRatio({ diploidLethalEquivalents: 6, recipientInbreeding: -0.1, offspringInbreeding: 0 }), 'rescueFitnessRatio: recipientInbreeding must be in [0, 1], got -0.1'],
    ['rescue offspring F', () => rescueFitnessRatio({ diploidLethalEquivalents: 6, recipientInbreeding: 0.1, offspringInbreeding: 2 }), 'rescueFitnessRatio: offspringInbreeding must be in [0, 1], got 2'],
    ['rescue infinite LE', () => rescueFitnessRatio({ diploidLethalEquivalents: Number.POSITIVE_INFINITY, recipientInbreeding: 0.1, offspringInbreeding: 0 }), 'rescueFitnessRatio: diploidLethalEquivalents must be a finite number ≥ 0, got Infinity'],
    ['fitness 0', () => diploidLethalEquivalentsFromFitness({ relativeFitness: 0, inbreeding: 0.25 }), 'diploidLethalEquivalentsFromFitness: relativeFitness must be in (0, 1], got 0'],
    ['fitness above 1', () => diploidLethalEquivalentsFromFitness({ relativeFitness: 1.1, inbreeding: 0.25 }), 'diploidLethalEquivalentsFromFitness: relativeFitness must be in (0, 1], got 1.1'],
    ['F of 0 for the inverse', () => diploidLethalEquivalentsFromFitness({ relativeFitness: 0.8, inbreeding: 0 }), 'diploidLethalEquivalentsFromFitness: inbreeding must be in (0, 1], got 0'],
    ['kinship above 1', () => secondGenerationCrossInbreeding({ kinshipWithinFirst: 0.3, kinshipWithinSecond: 1.5, kinshipBetween: 0 }), 'secondGenerationCrossInbreeding: kinshipWithinSecond must be in [0, 1], got 1.5'],
  ]
  it.each(cases)('%s', (_name, call, message) => {
    expect(call).toThrow(RangeError)
    expect(call).toThrow(message)
  })
})

describe('load: properties', () => {
  const lethalEquivalents = fc.double({ min: 0, max: 50, noNaN: true })
  const inbreeding = fc.double({ min: 0, max: 1, noNaN: true })
  it('relative fitness is in (0, 1] and non-increasing in F and in lethal equivalents', () => {
    fc.assert(fc.property(lethalEquivalents, lethalEquivalents, inbreeding, inbreeding, (a, b, c, d) => {
      const [fewer, more] = a <= b ? [a, b] : [b, a]
      const [lower, higher] = c <= d ? [c, d] : [d, c]
      const base = relativeFitness({ diploidLethalEquivalents: fewer, inbreeding: lower })
      expect(base).toBeGreaterThan(0)
      expect(base).toBeLessThanOrEqual(1)
      expect(relativeFitness({ diploidLethalEquivalents: fewer, inbreeding: higher })).toBeLessThanOrEqual(base)
      expect(relativeFitness({ diploidLethalEquivalents: more, inbreeding: lower })).toBeLessThanOrEqual(base)
    }))
  })
  it('strictly decreasing in F when there is a load', () => {
    fc.assert(fc.property(fc.double({ min: 0.1, max: 50, noNaN: true }), fc.double({ min: 0, max: 0.9, noNaN: true }), (le, f) => {
      expect(relativeFitness({ diploidLethalEquivalents: le, inbreeding: f + 0.1 })).toBeLessThan(relativeFitness({ diploidLethalEquivalents: le, inbreeding: f }))
    }))
  })
  it('fitness reduction is 1 − relative fitness', () => {
    fc.assert(fc.property(lethalEquivalents, inbreeding, (le, f) => {
      const sum = fitnessReductionFromInbreeding({ diploidLethalEquivalents: le, inbreeding: f }) + relativeFitness({ diploidLethalEquivalents: le, inbreeding: f })
      expect(Math.abs(sum - 1)).toBeLessThanOrEqual(4 * EPS)
    }))
  })
  it('rescue ratio is W(offspring) / W(recipient)', () => {
    fc.assert(fc.property(lethalEquivalents, inbreeding, inbreeding, (le, recipient, offspring) => {
      const ratio = rescueFitnessRatio({ diploidLethalEquivalents: le, recipientInbreeding: recipient, offspringInbreeding: offspring })
      const quotient = relativeFitness({ diploidLethalEquivalents: le, inbreeding: offspring }) / relativeFitness({ diploidLethalEquivalents: le, inbreeding: recipient })
      expectClose(ratio, quotient, { relative: (8 + le) * EPS }, `2B=${le}, ${recipient} → ${offspring}`)
      if (offspring < recipient && le > 0) expect(ratio).toBeGreaterThanOrEqual(1)
    }))
  })
  it('diploidLethalEquivalentsFromFitness inverts relativeFitness', () => {
    fc.assert(fc.property(fc.double({ min: 0, max: 50, noNaN: true }), fc.double({ min: 1e-3, max: 1, noNaN: true }), (le, f) => {
      const w = relativeFitness({ diploidLethalEquivalents: le, inbreeding: f })
      fc.pre(w < 1)
      const back = diploidLethalEquivalentsFromFitness({ relativeFitness: w, inbreeding: f })
      // ln W loses relative precision as W → 1 (B·F small): condition 1/|ln W|.
      expectClose(back, le, { relative: 8 * EPS * (1 + 1 / Math.abs(Math.log(w))), absolute: 1e-300 }, `2B=${le}, F=${f}`)
    }))
  })
  it('F2 of a cross lies between F1 and the mean parental kinship', () => {
    fc.assert(fc.property(inbreeding, inbreeding, inbreeding, (a, b, between) => {
      const f2 = secondGenerationCrossInbreeding({ kinshipWithinFirst: a, kinshipWithinSecond: b, kinshipBetween: between })
      const low = Math.min(between, (a + b) / 2)
      const high = Math.max(between, (a + b) / 2)
      expect(f2).toBeGreaterThanOrEqual(low * (1 - 4 * EPS))
      expect(f2).toBeLessThanOrEqual(high * (1 + 4 * EPS))
    }))
  })
})
