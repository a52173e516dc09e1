/**
 * Outbreeding-depression risk screen (shared/genetics/outbreeding) against
 * the decision rule of Frankham et al. (2011) as given in SCIENCE.md §7 and
 * §11 rows 57–58: all 16 yes/no combinations, 'unknown' answers, wording
 * and domain errors.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { outbreedingRisk } from '../../../shared/genetics/outbreeding'
import type { OutbreedingQuestion, ScreenAnswer } from '../../../shared/genetics/outbreeding'
import screen from '../../fixtures/genetics/outbreeding-frankham-2011.json'

type Answers = Record<OutbreedingQuestion, ScreenAnswer>

describe('outbreeding risk: published outcomes (Frankham et al. 2011 abstract; SCIENCE.md §11 rows 57–58)', () => {
  it('names its source', () => expect(screen.source).toMatch(/Frankham R.*2011/))
  it.each(screen.publishedOutcomes.map(o => [o.row, o] as const))('row %s', (_row, outcome) => {
    expect(outbreedingRisk(outcome.input as Answers).level).toBe(outcome.level)
  })
})

describe('outbreeding risk: every combination of answers', () => {
  it('the fixture covers all 16 yes/no combinations, exactly one of them low', () => {
    const yesNo = screen.cases.filter(c => Object.values(c.input).every(v => typeof v === 'boolean'))
    expect(new Set(yesNo.map(c => JSON.stringify(c.input))).size).toBe(16)
    expect(yesNo.filter(c => c.level === 'low')).toHaveLength(1)
  })
  it.each(screen.cases.map(c => [JSON.stringify(c.input), c] as const))('%s', (_name, testCase) => {
    const result = outbreedingRisk(testCase.input as Answers)
    expect(result.level).toBe(testCase.level)
    expect(result.raisedBy).toEqual(testCase.raisedBy)
    expect(result.unanswered).toEqual(testCase.unanswered)
    // One plain-words reason per raised criterion, or one reason for "low".
    expect(result.reasons).toHaveLength(Math.max(1, testCase.raisedBy.length))
  })
})

describe('outbreeding risk: wording', () => {
  it('says why the risk is low', () => {
    const result = outbreedingRisk({ sameSpecies: true, fixedChromosomalDifferences: false, geneFlowWithin500Years: true, similarEnvironments: true })
    expect(result.reasons[0]).toMatch(/low probability of outbreeding depression/)
  })
  it('names each triggered criterion in plain words', () => {
    const result = outbreedingRisk({ sameSpecies: false, fixedChromosomalDifferences: true, geneFlowWithin500Years: false, similarEnvironments: false })
    expect(result.reasons[0]).toMatch(/different species/)
    expect(result.reasons[1]).toMatch(/chromosom/)
    expect(result.reasons[2]).toMatch(/500 years/)
    expect(result.reasons[3]).toMatch(/different environments/)
  })
  it('says when an unknown answer is counted as a risk', () => {
    const result = outbreedingRisk({ sameSpecies: true, fixedChromosomalDifferences: false, geneFlowWithin500Years: 'unknown', similarEnvironments: true })
    expect(result.level).toBe('elevated')
    expect(result.reasons[0]).toMatch(/not known/)
    expect(result.reasons[0]).toMatch(/counted as a risk/)
  })
})

describe('outbreeding risk: properties', () => {
  const answer = fc.constantFrom<ScreenAnswer>(true, false, 'unknown')
  const answers = fc.record({ sameSpecies: answer, fixedChromosomalDifferences: answer, geneFlowWithin500Years: answer, similarEnvironments: answer })
  it('low if and only if nothing raised the risk; any unknown means elevated', () => {
    fc.assert(fc.property(answers, (input) => {
      const result = outbreedingRisk(input)
      expect(result.level === 'low').toBe(result.raisedBy.length === 0)
      if (Object.values(input).includes('unknown')) expect(result.level).toBe('elevated')
      for (const question of result.unanswered) expect(input[question]).toBe('unknown')
    }))
  })
  it('changing a risky answer to the safe one never raises the level', () => {
    const safe: Answers = { sameSpecies: true, fixedChromosomalDifferences: false, geneFlowWithin500Years: true, similarEnvironments: true }
    fc.assert(fc.property(answers, fc.constantFrom<OutbreedingQuestion>('sameSpecies', 'fixedChromosomalDifferences', 'geneFlowWithin500Years', 'similarEnvironments'), (input, question) => {
      const before = outbreedingRisk(input)
      const after = outbreedingRisk({ ...input, [question]: safe[question] })
      expect(after.raisedBy.length).toBeLessThanOrEqual(before.raisedBy.length)
      if (before.level === 'low') expect(after.level).toBe('low')
    }))
  })
})

describe('outbreeding risk: domain errors use the standard RangeError message', () => {
  it('rejects answers other than true, false or \'unknown\'', () => {
    const call = () => outbreedingRisk({ sameSpecies: true, fixedChromosomalDifferences: 'maybe' as never, geneFlowWithin500Years: true, similarEnvironments: true })
    expect(call).toThrow(RangeError)
    expect(call).toThrow('outbreedingRisk: fixedChromosomalDifferences must be true, false or \'unknown\', got maybe')
    expect(() => outbreedingRisk({ sameSpecies: undefined as never, fixedChromosomalDifferences: false, geneFlowWithin500Years: true, similarEnvironments: true }))
      .toThrow('outbreedingRisk: sameSpecies must be true, false or \'unknown\', got undefined')
  })
})
