/**
 * Scenario inputs → simulation parameters (shared/simulation/from-scenario.ts): the years →
 * generations conversion, what each model takes from the scenario and the records, the
 * problems that stop a run and the notes on what was assumed; and, for any valid scenario, the
 * parameters pass the engine's own checks.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { establishmentFromScenario, rescueFromScenario, scenarioGenerations, type ScenarioSimulationInput } from '../../../shared/simulation/from-scenario'
import { simulationParameterIssue } from '../../../shared/simulation/check-parameters'
import type { ScenarioInputsLike } from '../../../shared/proposals/types'

const load = { diploidLethalEquivalents: 12, range: [3.1, 30.3] as const, citation: 'custom' }
const variant = { name: 'Warm-water tolerance', sourceFrequency: 0.3, s: 0.04, sRange: [0.01, 0.08] as const, h: 0.5, hRange: [0.2, 0.8] as const }

function inputs(changes: Partial<ScenarioInputsLike> = {}): ScenarioInputsLike {
  return {
    schedule: { animalsPerEvent: 4, females: 2, males: 2, intervalYears: 5, events: 3, firstEventYear: 0 },
    sourceSubpopulationId: 7,
    variants: [variant],
    load,
    horizonYears: 50,
    ...changes,
  }
}

const recipient = { latestCensus: { year: 2024, adults: 60 }, workingNe: 15, generationTimeYears: 2.5 }
const source = { latestCensus: { year: 2023, adults: 400 }, workingNe: 120, generationTimeYears: 2.5 }
const input = (changes: Partial<ScenarioSimulationInput> = {}): ScenarioSimulationInput => ({ inputs: inputs(), recipient, source, ...changes })

describe('scenarioGenerations', () => {
  it('horizon ⌈years / L⌉, first release round(year / L), interval round(years / L) ≥ 1', () => {
    expect(scenarioGenerations(inputs(), 2.5)).toEqual({ times: { generationTimeYears: 2.5, generations: 20, firstEventGeneration: 0, eventInterval: 2, events: 3 }, notes: [] })
    // 50 / 3 = 16.67 → 17 generations; 5 / 3 = 1.67 → every 2 generations (6 years), noted.
    const rounded = scenarioGenerations(inputs(), 3)
    expect(rounded.times).toMatchObject({ generations: 17, eventInterval: 2 })
    expect(rounded.notes).toEqual(['Releases every 5 years are simulated every 2 generations (6 years at 3 years per generation).'])
    // Releases closer than a generation are spread one generation apart.
    const close = scenarioGenerations(inputs({ schedule: { animalsPerEvent: 2, females: 1, males: 1, intervalYears: 1, events: 4, firstEventYear: 0 } }), 4)
    expect(close.times.eventInterval).toBe(1)
    expect(close.notes).toEqual(['Releases every 1 year are simulated every generation (4 years at 4 years per generation).'])
  })

  it('counts only releases inside the horizon, and says how many were left out', () => {
    const result = scenarioGenerations(inputs({ schedule: { animalsPerEvent: 2, females: 1, males: 1, intervalYears: 20, events: 4, firstEventYear: 10 }, horizonYears: 50 }), 1)
    expect(result.times).toMatchObject({ generations: 50, firstEventGeneration: 10, eventInterval: 20, events: 2 })
    expect(result.notes).toEqual(['2 releases after the 50 years horizon are left out.'])
  })

  it('the baseline (no schedule) has no events; the horizon is at least one generation', () => {
    expect(scenarioGenerations(inputs({ schedule: null, horizonYears: 1 }), 5).times).toMatchObject({ generations: 1, events: 0 })
  })
})

describe('establishmentFromScenario', () => {
  it('takes N and Ne of the recipient, the variant\'s s, h and q, and k animals per release', () => {
    expect(establishmentFromScenario(input())).toEqual({
      parameters: {
        census: 60, effectiveSize: 15, s: 0.04, h: 0.5, sourceFrequency: 0.3,
        migrantsPerEvent: 4, eventInterval: 2, events: 3, firstEventGeneration: 0, migrationRate: 0, generations: 20,
      },
      problems: [],
      notes: [],
    })
  })

  it('applies the scenario\'s what-if overrides and follows the chosen variant', () => {
    const other = { ...variant, name: 'Second', s: 0.1, h: 0.3, sourceFrequency: 0.9 }
    const result = establishmentFromScenario(input({ inputs: inputs({ variants: [variant, other], recipientOverrides: { census: 80, effectiveSize: 40, generationTimeYears: 5 } }), variantIndex: 1 }))
    expect(result.parameters).toMatchObject({ census: 80, effectiveSize: 40, s: 0.1, h: 0.3, sourceFrequency: 0.9, generations: 10, eventInterval: 1 })
  })

  it('says why it cannot run: the baseline, no variant, no census', () => {
    expect(establishmentFromScenario(input({ inputs: inputs({ schedule: null }) })).problems[0]).toMatch(/moves no animals/)
    expect(establishmentFromScenario(input({ inputs: inputs({ variants: [] }) })).problems).toEqual(['The scenario has no adaptive variant to follow: add one.'])
    const noCensus = establishmentFromScenario(input({ recipient: { ...recipient, latestCensus: null } }))
    expect(noCensus.parameters).toBeNull()
    expect(noCensus.problems[0]).toMatch(/no census count/)
    expect(establishmentFromScenario(input({ inputs: inputs({ schedule: { animalsPerEvent: 2, females: 1, males: 1, intervalYears: 5, events: 2, firstEventYear: 60 } }) })).problems)
      .toEqual(['No release falls within the 50 years horizon.'])
  })
})

describe('rescueFromScenario', () => {
  it('recipient and source with Ne/N from their records, the schedule, the variant as adaptive locus, default load', () => {
    const result = rescueFromScenario(input())
    expect(result.problems).toEqual([])
    expect(result.parameters).toEqual({
      recipient: { census: 60, effectiveRatio: 0.25 },
      source: { census: 400, effectiveRatio: 0.3 },
      generations: 20,
      adaptive: { s: 0.04, h: 0.5, sourceFrequency: 0.3, recipientFrequency: 0 },
      translocation: { migrantsPerEvent: 4, eventInterval: 2, events: 3, firstEventGeneration: 0 },
    })
    expect(result.notes.some(note => /default mutation load/.test(note))).toBe(true)
  })

  it('caps Ne/N at 1 with a note, and runs without a variant (noted)', () => {
    const result = rescueFromScenario(input({ inputs: inputs({ variants: [] }), source: { ...source, workingNe: 900 } }))
    expect(result.parameters?.source.effectiveRatio).toBe(1)
    expect(result.parameters?.adaptive).toBeNull()
    expect(result.notes).toEqual(expect.arrayContaining([
      'The source\'s Ne (900) is above its census; the model uses Ne/N = 1.',
      'The scenario has no adaptive variant: the model follows the harmful-mutation load and neutral diversity only.',
    ]))
  })

  it('simulates a source above 1,000 animals as 1,000 with its own Ne/N (noted)', () => {
    const result = rescueFromScenario(input({ source: { ...source, latestCensus: { year: 2023, adults: 50_000 }, workingNe: 5_000 } }))
    expect(result.parameters?.source).toEqual({ census: 1000, effectiveRatio: 0.1 })
    expect(result.notes).toContain('The source (50,000 animals) is simulated as 1,000 animals with the same Ne/N: a large source changes little over the horizon, and the model\'s cost grows with the square of the population size.')
  })

  it('says why it cannot run: no source, source too small for a release, a recipient above the model\'s limit', () => {
    expect(rescueFromScenario(input({ source: null })).problems).toEqual(['Choose a wild source with a census count: the individual-based model simulates the source population too.'])
    expect(rescueFromScenario(input({ source: { ...source, latestCensus: { year: 2023, adults: 3 } } })).problems).toEqual(['Each release takes 4 animals but the source has 3.'])
    expect(rescueFromScenario(input({ recipient: { ...recipient, latestCensus: { year: 2023, adults: 5_000 } } })).problems[0]).toMatch(/at most 2,000 animals per population; the recipient has 5,000/)
  })
})

describe('any valid scenario maps to parameters the engine accepts', () => {
  const scenarioArbitrary = fc.record({
    animals: fc.integer({ min: 1, max: 40 }),
    intervalYears: fc.double({ min: 0.1, max: 50, noNaN: true }),
    events: fc.integer({ min: 1, max: 50 }),
    firstEventYear: fc.double({ min: 0, max: 30, noNaN: true }),
    horizonYears: fc.double({ min: 1, max: 500, noNaN: true }),
    generationTimeYears: fc.double({ min: 0.2, max: 30, noNaN: true }),
    census: fc.integer({ min: 2, max: 2000 }),
    effectiveSize: fc.double({ min: 0.5, max: 5000, noNaN: true }),
    sourceCensus: fc.integer({ min: 40, max: 5000 }),
    s: fc.double({ min: -0.5, max: 2, noNaN: true }),
    h: fc.double({ min: 0, max: 1, noNaN: true }),
    q: fc.double({ min: 0.001, max: 1, noNaN: true }),
  })
  it('establishment and rescue parameters pass simulationParameterIssue, or the mapping names a problem', () => {
    fc.assert(fc.property(scenarioArbitrary, (draw) => {
      const scenarioInput: ScenarioSimulationInput = {
        inputs: inputs({
          schedule: { animalsPerEvent: draw.animals, females: draw.animals, males: 0, intervalYears: draw.intervalYears, events: draw.events, firstEventYear: draw.firstEventYear },
          variants: [{ ...variant, s: draw.s, h: draw.h, sourceFrequency: draw.q }],
          horizonYears: draw.horizonYears,
        }),
        recipient: { latestCensus: { year: 2024, adults: draw.census }, workingNe: draw.effectiveSize, generationTimeYears: draw.generationTimeYears },
        source: { latestCensus: { year: 2024, adults: draw.sourceCensus }, workingNe: draw.sourceCensus / 2, generationTimeYears: draw.generationTimeYears },
      }
      for (const [model, mapped] of [['establishment', establishmentFromScenario(scenarioInput)], ['rescue', rescueFromScenario(scenarioInput)]] as const) {
        if (mapped.parameters) expect(simulationParameterIssue(model, mapped.parameters)).toBeNull()
        else expect(mapped.problems.length).toBeGreaterThan(0)
      }
    }), { numRuns: 150 })
  })
})
