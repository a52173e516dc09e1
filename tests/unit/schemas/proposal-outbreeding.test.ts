/**
 * The outbreeding screen pre-filled from the records (prefillOutbreedingAnswers) and merged with
 * what people answer (mergeOutbreedingAnswers), shared/schemas/proposal.ts. Expected values follow
 * the rules written in those functions' comments (Frankham et al. 2011 questions, 500-year gene-flow
 * threshold); the records are invented.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { outbreedingRisk } from '../../../shared/genetics'
import {
  OUTBREEDING_QUESTION_IDS, mergeOutbreedingAnswers, prefillOutbreedingAnswers,
  type OutbreedingAnswers, type OutbreedingRecord,
} from '../../../shared/schemas/proposal'

const record = (name: string, overrides: Partial<OutbreedingRecord> = {}): OutbreedingRecord =>
  ({ name, speciesId: 1, yearsIsolated: 10, environmentClass: 'cove forest', ...overrides })

const values = (answers: OutbreedingAnswers) => Object.fromEntries(OUTBREEDING_QUESTION_IDS.map(id => [id, answers[id].value]))

describe('prefillOutbreedingAnswers', () => {
  it('same species, recent isolation, same environment class (any case) → the low-risk answers, karyotype unknown', () => {
    const answers = prefillOutbreedingAnswers(record('A'), [record('B', { environmentClass: '  Cove Forest ' })], false)
    expect(values(answers)).toEqual({ sameSpecies: true, fixedChromosomalDifferences: 'unknown', geneFlowWithin500Years: true, similarEnvironments: true })
    expect(answers.fixedChromosomalDifferences.prefilledFrom).toBeUndefined()
    expect(answers.geneFlowWithin500Years.prefilledFrom).toBe('yearsIsolated (A: 10; B: 10)')
    expect(answers.similarEnvironments.prefilledFrom).toBe('environmentClass (A: cove forest; B:   Cove Forest )')
    expect(answers.sameSpecies.prefilledFrom).toBe('species (A: species 1; B: species 1)')
  })

  it('the 500-year threshold: 499 → yes, 500 → no, on either side; a missing figure → unknown unless the other is ≥ 500', () => {
    const geneFlow = (recipient: number | null, source: number | null) =>
      prefillOutbreedingAnswers(record('R', { yearsIsolated: recipient }), [record('S', { yearsIsolated: source })], false).geneFlowWithin500Years.value
    expect(geneFlow(499, 0)).toBe(true)
    expect(geneFlow(500, 0)).toBe(false)
    expect(geneFlow(0, 500)).toBe(false)
    expect(geneFlow(null, 10)).toBe('unknown')
    expect(geneFlow(10, null)).toBe('unknown')
    expect(geneFlow(null, 800)).toBe(false)
  })

  it('different species or environments → the risky answer; a missing class → unknown; names the species', () => {
    const answers = prefillOutbreedingAnswers(record('R', { speciesName: 'Mistridge salamander' }), [record('S', { speciesId: 2, speciesName: 'Other newt', environmentClass: null })], false)
    expect(answers.sameSpecies.value).toBe(false)
    expect(answers.sameSpecies.prefilledFrom).toBe('species (R: Mistridge salamander; S: Other newt)')
    expect(answers.similarEnvironments.value).toBe('unknown')
    expect(answers.similarEnvironments.prefilledFrom).toBe('environmentClass (R: cove forest; S: not recorded)')
  })

  it('several sources: the riskiest answer wins (false over unknown over true)', () => {
    const answers = prefillOutbreedingAnswers(record('R'), [record('S1'), record('S2', { environmentClass: null }), record('S3', { environmentClass: 'bog' })], false)
    expect(answers.similarEnvironments.value).toBe(false)
    const unknownOnly = prefillOutbreedingAnswers(record('R'), [record('S1'), record('S2', { yearsIsolated: null })], false)
    expect(unknownOnly.geneFlowWithin500Years.value).toBe('unknown')
  })

  it('a captive source makes every answer at best unknown; no source at all → all unknown without a field', () => {
    const captive = prefillOutbreedingAnswers(record('R'), [record('S')], true)
    expect(values(captive)).toEqual({ sameSpecies: 'unknown', fixedChromosomalDifferences: 'unknown', geneFlowWithin500Years: 'unknown', similarEnvironments: 'unknown' })
    expect(captive.similarEnvironments.prefilledFrom).toMatch(/captive source: no record/)
    const longIsolated = prefillOutbreedingAnswers(record('R', { yearsIsolated: 900 }), [], true)
    expect(longIsolated.geneFlowWithin500Years.value).toBe(false)
    const none = prefillOutbreedingAnswers(record('R'), [], false)
    for (const id of OUTBREEDING_QUESTION_IDS) expect(none[id]).toEqual({ value: 'unknown' })
  })

  it('the engine screen reads the result: low risk needs a karyotype answer', () => {
    const answers = prefillOutbreedingAnswers(record('A'), [record('B')], false)
    const screen = outbreedingRisk(values(answers) as Parameters<typeof outbreedingRisk>[0])
    expect(screen.level).toBe('elevated')
    expect(screen.unanswered).toEqual(['fixedChromosomalDifferences'])
  })
})

describe('mergeOutbreedingAnswers', () => {
  const records = prefillOutbreedingAnswers(record('R'), [record('S', { environmentClass: 'bog' })], false) // similar: false
  const open = prefillOutbreedingAnswers(record('R'), [], false) // all unknown

  it('an answer against a known record answer needs a reason; with one it is kept with the record field', () => {
    const refused = mergeOutbreedingAnswers(records, records, records, { similarEnvironments: { value: true } })
    expect(refused.issues).toEqual([{ path: 'outbreedingAnswers.similarEnvironments.overrideReason', message: 'The records give "no" here; say why the answer is "yes".' }])
    const blank = mergeOutbreedingAnswers(records, records, records, { similarEnvironments: { value: true, overrideReason: '   ' } })
    expect(blank.issues).toHaveLength(1)
    const kept = mergeOutbreedingAnswers(records, records, records, { similarEnvironments: { value: true, overrideReason: ' Both cool and wet. ' } })
    expect(kept.issues).toEqual([])
    expect(kept.answers.similarEnvironments).toEqual({ value: true, prefilledFrom: records.similarEnvironments.prefilledFrom, overrideReason: 'Both cool and wet.' })
  })

  it('an answer equal to the records drops a stale reason; an open question is answered freely', () => {
    const same = mergeOutbreedingAnswers(records, records, records, { similarEnvironments: { value: false, overrideReason: 'no need' }, fixedChromosomalDifferences: { value: false } })
    expect(same.issues).toEqual([])
    expect(same.answers.similarEnvironments).toEqual(records.similarEnvironments)
    expect(same.answers.fixedChromosomalDifferences).toEqual({ value: false })
  })

  it('new records: followed answers follow, overrides stay while the records still differ, given answers stay while records are silent', () => {
    const stored: OutbreedingAnswers = {
      ...records,
      similarEnvironments: { value: true, prefilledFrom: records.similarEnvironments.prefilledFrom, overrideReason: 'Checked.' },
      fixedChromosomalDifferences: { value: false },
    }
    const toOpen = mergeOutbreedingAnswers(stored, records, open)
    expect(toOpen.answers.sameSpecies).toEqual({ value: 'unknown' })
    expect(toOpen.answers.similarEnvironments).toEqual({ value: true })
    expect(toOpen.answers.fixedChromosomalDifferences).toEqual({ value: false })
    const back = mergeOutbreedingAnswers(stored, records, records)
    expect(back.answers.similarEnvironments).toEqual(stored.similarEnvironments)
    const agreeing = prefillOutbreedingAnswers(record('R'), [record('S')], false) // similar: true
    const nowAgrees = mergeOutbreedingAnswers(stored, records, agreeing)
    expect(nowAgrees.answers.similarEnvironments).toEqual(agreeing.similarEnvironments)
  })

  const answerValue = fc.constantFrom<true | false | 'unknown'>(true, false, 'unknown')
  const screen = fc.record({
    sameSpecies: answerValue, fixedChromosomalDifferences: answerValue, geneFlowWithin500Years: answerValue, similarEnvironments: answerValue,
  }).map(v => Object.fromEntries(OUTBREEDING_QUESTION_IDS.map(id => [id, { value: v[id], prefilledFrom: `${id} field` }])) as OutbreedingAnswers)
  const patch = fc.dictionary(
    fc.constantFrom(...OUTBREEDING_QUESTION_IDS),
    fc.record({ value: answerValue, overrideReason: fc.option(fc.constantFrom('reason', ''), { nil: undefined }) }, { requiredKeys: ['value'] }),
  )

  it('property: the result carries the current records\' fields, and every answer against a known record has a reason unless an issue says so', () => {
    fc.assert(fc.property(screen, screen, screen, patch, (stored, previous, current, sent) => {
      const { answers, issues } = mergeOutbreedingAnswers(stored, previous, current, sent as Partial<OutbreedingAnswers>)
      for (const id of OUTBREEDING_QUESTION_IDS) {
        expect(answers[id].prefilledFrom).toBe(current[id].prefilledFrom)
        const against = current[id].value !== 'unknown' && answers[id].value !== current[id].value
        if (against) expect(answers[id].overrideReason !== undefined || issues.some(issue => issue.path.includes(id))).toBe(true)
        else expect(answers[id].overrideReason).toBeUndefined()
      }
    }))
  })

  it('property: with unchanged records and no patch, answers that follow the records stay as they are', () => {
    fc.assert(fc.property(screen, (records) => {
      const { answers, issues } = mergeOutbreedingAnswers(records, records, records)
      expect(issues).toEqual([])
      expect(answers).toEqual(records)
    }))
  })
})
