/**
 * The proposal and scenario zod schemas (shared/schemas/proposal.ts, shared/schemas/scenario.ts):
 * what forms and routes accept, the defaults they fill, and the cited defaults of a new scenario.
 * Lethal-equivalent defaults are checked against the engine's cited table
 * (shared/genetics/load/lethal-equivalents.ts; SCIENCE.md §6.1).
 */
import { describe, expect, it } from 'vitest'
import { CAPTIVE_MAMMAL_LETHAL_EQUIVALENT_RANGE, PUBLISHED_LETHAL_EQUIVALENTS } from '../../../shared/genetics'
import {
  CHECKLIST_ITEM_IDS, OUTBREEDING_QUESTIONS, OUTBREEDING_QUESTION_IDS, PROPOSAL_CHECKLIST_ITEMS, ProposalCreateSchema,
  ProposalListQuerySchema, ProposalPatchSchema,
} from '../../../shared/schemas/proposal'
import {
  EstablishmentCalcSchema, LOAD_CITATIONS, ScenarioCreateSchema, ScenarioInputsSchema, ScenarioPatchSchema,
  baselineScenarioInputs, defaultScenarioInputs,
} from '../../../shared/schemas/scenario'

const paths = (result: { success: boolean, error?: { issues: { path: PropertyKey[] }[] } }) =>
  (result.error?.issues ?? []).map(issue => issue.path.join('.'))

describe('ProposalCreateSchema', () => {
  it('fills purpose and sources, trims the title, turns an empty captive source into null', () => {
    expect(ProposalCreateSchema.parse({ title: '  Rescue  ', recipientId: 3, captiveSource: '' }))
      .toEqual({ title: 'Rescue', recipientId: 3, purpose: '', sourceSubpopulationIds: [], captiveSource: null })
  })

  it('refuses a blank or 201-character title, 11 sources, duplicates and the recipient as a source', () => {
    expect(paths(ProposalCreateSchema.safeParse({ title: ' ', recipientId: 1 }))).toEqual(['title'])
    expect(paths(ProposalCreateSchema.safeParse({ title: 'x'.repeat(201), recipientId: 1 }))).toEqual(['title'])
    expect(ProposalCreateSchema.safeParse({ title: 'x'.repeat(200), recipientId: 1 }).success).toBe(true)
    expect(paths(ProposalCreateSchema.safeParse({ title: 't', recipientId: 1, sourceSubpopulationIds: Array.from({ length: 11 }, (_, i) => i + 2) }))).toEqual(['sourceSubpopulationIds'])
    expect(paths(ProposalCreateSchema.safeParse({ title: 't', recipientId: 1, sourceSubpopulationIds: [2, 2] }))).toEqual(['sourceSubpopulationIds'])
    expect(paths(ProposalCreateSchema.safeParse({ title: 't', recipientId: 1, sourceSubpopulationIds: [1] }))).toEqual(['sourceSubpopulationIds'])
    expect(paths(ProposalCreateSchema.safeParse({ title: 't', recipientId: 2_147_483_648 }))).toEqual(['recipientId'])
  })
})

describe('ProposalPatchSchema', () => {
  it('needs the version; accepts partial sections; refuses unknown checklist ids and narrative keys', () => {
    expect(paths(ProposalPatchSchema.safeParse({ title: 'x' }))).toEqual(['version'])
    expect(ProposalPatchSchema.parse({ narrative: { rationale: 'r' }, outbreedingAnswers: { sameSpecies: { value: 'unknown' } }, checklist: { quarantine: { done: true } }, version: 2 }))
      .toEqual({ narrative: { rationale: 'r' }, outbreedingAnswers: { sameSpecies: { value: 'unknown' } }, checklist: { quarantine: { done: true } }, version: 2 })
    expect(paths(ProposalPatchSchema.safeParse({ checklist: { unknown: { done: true } }, version: 0 }))).toEqual(['checklist'])
    expect(paths(ProposalPatchSchema.safeParse({ narrative: { poem: 'x' }, version: 0 }))).toEqual(['narrative'])
    expect(paths(ProposalPatchSchema.safeParse({ narrative: { rationale: 'x'.repeat(20_001) }, version: 0 }))).toEqual(['narrative.rationale'])
    expect(ProposalPatchSchema.safeParse({ narrative: { rationale: 'x'.repeat(20_000) }, version: 0 }).success).toBe(true)
    expect(ProposalPatchSchema.safeParse({ recommendedScenarioId: null, version: 0 }).success).toBe(true)
    expect(paths(ProposalPatchSchema.safeParse({ outbreedingAnswers: { sameSpecies: { value: 'yes' } }, version: 0 }))).toEqual(['outbreedingAnswers.sameSpecies.value'])
  })
})

describe('ProposalListQuerySchema', () => {
  it('parses the filters from query strings', () => {
    expect(ProposalListQuerySchema.parse({ status: 'draft', recipientId: '12', mine: 'true' })).toEqual({ status: 'draft', recipientId: 12, mine: true })
    expect(ProposalListQuerySchema.parse({})).toEqual({})
    expect(ProposalListQuerySchema.safeParse({ status: 'lost' }).success).toBe(false)
    expect(ProposalListQuerySchema.safeParse({ recipientId: '0' }).success).toBe(false)
  })
})

describe('checklist and screen data', () => {
  it('five checklist items with unique ids; four screen questions in the engine\'s names', () => {
    expect(CHECKLIST_ITEM_IDS).toEqual(['disease-screening', 'quarantine', 'husbandry', 'welfare', 'permits'])
    expect(new Set(PROPOSAL_CHECKLIST_ITEMS.map(item => item.label)).size).toBe(5)
    expect(OUTBREEDING_QUESTIONS.map(question => question.id)).toEqual([...OUTBREEDING_QUESTION_IDS])
    expect(OUTBREEDING_QUESTIONS.map(question => question.lowRiskAnswer)).toEqual([true, false, true, true])
  })
})

describe('ScenarioInputsSchema and the defaults', () => {
  it('the baseline inputs and the first scenario\'s defaults are valid; only the baseline has no schedule', () => {
    expect(ScenarioInputsSchema.parse(baselineScenarioInputs())).toEqual(baselineScenarioInputs())
    expect(ScenarioCreateSchema.safeParse({ name: 'A', inputs: defaultScenarioInputs(4) }).success).toBe(true)
    expect(paths(ScenarioCreateSchema.safeParse({ name: 'A', inputs: baselineScenarioInputs() }))).toEqual(['inputs.schedule'])
    expect(ScenarioPatchSchema.safeParse({ inputs: baselineScenarioInputs(80), version: 1 }).success).toBe(true)
  })

  it('the default load is the cited 2B = 12 (O\'Grady et al. 2006) with the Ralls et al. (1988) median to top of range', () => {
    const { load } = defaultScenarioInputs(null)
    expect(load.diploidLethalEquivalents).toBe(PUBLISHED_LETHAL_EQUIVALENTS.wildMammalsAndBirdsLifeHistory.diploidLethalEquivalents)
    expect(load.range).toEqual([PUBLISHED_LETHAL_EQUIVALENTS.captiveMammalJuvenileSurvivalMedian.diploidLethalEquivalents, CAPTIVE_MAMMAL_LETHAL_EQUIVALENT_RANGE.high])
    expect(load.citation).toBe('wildMammalsAndBirdsLifeHistory')
    expect(LOAD_CITATIONS).toEqual([...Object.keys(PUBLISHED_LETHAL_EQUIVALENTS), 'custom'])
  })

  it('checks the schedule sum, the ranges and the heterozygote fitness at every corner', () => {
    const good = defaultScenarioInputs(1)
    const variant = good.variants[0]!
    expect(paths(ScenarioInputsSchema.safeParse({ ...good, schedule: { ...good.schedule!, females: 3 } }))).toEqual(['schedule.males'])
    expect(paths(ScenarioInputsSchema.safeParse({ ...good, variants: [{ ...variant, s: -1 }] }))).toEqual(expect.arrayContaining(['variants.0.s']))
    expect(paths(ScenarioInputsSchema.safeParse({ ...good, variants: [{ ...variant, sRange: [0.1, 0.01] }] }))).toEqual(expect.arrayContaining(['variants.0.sRange']))
    // h = 3, s = −0.5 → 1 + h·s = −0.5 at a corner.
    expect(paths(ScenarioInputsSchema.safeParse({ ...good, variants: [{ ...variant, s: 0.05, sRange: [-0.5, 0.1], h: 0.5, hRange: [0, 3] }] }))).toEqual(['variants.0.hRange'])
    expect(ScenarioInputsSchema.safeParse({ ...good, variants: [{ ...variant, s: 0.05, sRange: [-0.5, 0.1], h: 0.5, hRange: [0, 1.9] }] }).success).toBe(true)
    expect(paths(ScenarioInputsSchema.safeParse({ ...good, load: { ...good.load, range: [13, 20] } }))).toEqual(['load.range'])
    expect(paths(ScenarioInputsSchema.safeParse({ ...good, horizonYears: 0.5 }))).toEqual(['horizonYears'])
    expect(ScenarioInputsSchema.parse({ ...good, horizonYears: undefined }).horizonYears).toBe(50)
  })
})

describe('EstablishmentCalcSchema', () => {
  it('takes copies, or migrants with a frequency; leaves the domain to the engine', () => {
    expect(EstablishmentCalcSchema.safeParse({ census: 10, effectiveSize: 10, s: -5, h: 0.5, copies: 99 }).success).toBe(true)
    expect(EstablishmentCalcSchema.safeParse({ census: 10, effectiveSize: 10, s: 0.1, h: 0.5, migrantsPerEvent: 2, sourceFrequency: 0.5 }).success).toBe(true)
    expect(paths(EstablishmentCalcSchema.safeParse({ census: 10, effectiveSize: 10, s: 0.1, h: 0.5 }))).toEqual(['copies'])
    expect(paths(EstablishmentCalcSchema.safeParse({ census: 10, effectiveSize: 10, s: 0.1, h: 0.5, sourceFrequency: 0.5 }))).toEqual(['migrantsPerEvent'])
    expect(paths(EstablishmentCalcSchema.safeParse({ census: Number.NaN, effectiveSize: 10, s: 0.1, h: 0.5, copies: 1 }))).toEqual(['census'])
  })
})
