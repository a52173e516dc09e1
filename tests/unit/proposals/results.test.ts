/**
 * computeScenarioResults (shared/proposals/results.ts): every figure equals the engine's for
 * the same inputs, the copies mixture and the exact chain match an independent mpmath
 * computation (fixtures/results-reference.json), and the baseline, projection, migrants and
 * outbreeding parts behave as documented.
 */
import { describe, expect, expectTypeOf, it } from 'vitest'
import {
  conditionalFixationTime,
  exactFixationProbability,
  fixationMethodWarnings,
  fixationProbability,
  haldaneApproximation,
  inbreedingAfter,
  inbreedingTrajectory,
  outbreedingRisk,
  relativeFitness,
} from '#shared/genetics'
import { computeScenarioResults } from '#shared/proposals/results'
import { scheduleEstablishment } from '#shared/proposals/establishment'
import { binomialLogProbability } from '#shared/proposals/copies'
import type { RecipientFigures, ScenarioInputsLike } from '#shared/proposals/types'
import type { ScenarioInputs } from '#shared/schemas/scenario'
import { baselineScenarioInputs, defaultScenarioInputs } from '#shared/schemas/scenario'
import reference from './fixtures/results-reference.json'

const EPS = Number.EPSILON

function inputsWith(schedule: { animalsPerEvent: number, events: number, intervalYears?: number, firstEventYear?: number } | null, variant: { q: number, s: number, h: number }, horizonYears = 50): ScenarioInputsLike {
  return {
    schedule: schedule && {
      animalsPerEvent: schedule.animalsPerEvent,
      females: schedule.animalsPerEvent,
      males: 0,
      intervalYears: schedule.intervalYears ?? 5,
      events: schedule.events,
      firstEventYear: schedule.firstEventYear ?? 0,
    },
    sourceSubpopulationId: null,
    variants: [{ name: 'v', sourceFrequency: variant.q, s: variant.s, sRange: [variant.s / 2, variant.s * 2].sort((a, b) => a - b) as [number, number], h: variant.h, hRange: [Math.min(0, variant.h), Math.max(1, variant.h)] }],
    load: { diploidLethalEquivalents: 12, range: [3.1, 30.3], citation: 'wildMammalsAndBirdsLifeHistory' },
    horizonYears,
  }
}

const recipient = (census: number, effectiveSize: number, generationTimeYears = 2, initialInbreeding = 0): RecipientFigures =>
  ({ census, effectiveSize, generationTimeYears, initialInbreeding })

describe('the stored scenario inputs fit the results input', () => {
  it('ScenarioInputs from the schema is assignable to ScenarioInputsLike', () => {
    expectTypeOf<ScenarioInputs>().toExtend<ScenarioInputsLike>()
  })
})

describe('establishment equals the engine for the same inputs', () => {
  it('one animal homozygous for the variant (q = 1) is exactly fixationProbability with 2 copies at census N + 1', () => {
    const results = computeScenarioResults({ recipient: recipient(99, 30), inputs: inputsWith({ animalsPerEvent: 1, events: 1 }, { q: 1, s: 0.05, h: 0.5 }) })
    const expected = fixationProbability({ census: 100, effectiveSize: 30, s: 0.05, h: 0.5, copies: 2 })
    const variant = results.establishment[0]!
    expect(variant.diffusion.probability).toBeCloseTo(expected, 15)
    expect(Math.abs(variant.diffusion.probability - expected)).toBeLessThanOrEqual(8 * EPS * expected)
  })

  it('one animal at q: P = 2q(1 − q)·u(1) + q²·u(2) (hand computation with the engine\'s u)', () => {
    const q = 0.3
    const results = computeScenarioResults({ recipient: recipient(59, 15), inputs: inputsWith({ animalsPerEvent: 1, events: 1 }, { q, s: 0.08, h: 0.25 }) })
    const u = (copies: number) => fixationProbability({ census: 60, effectiveSize: 15, s: 0.08, h: 0.25, copies })
    const expected = 2 * q * (1 - q) * u(1) + q * q * u(2)
    expect(results.establishment[0]!.diffusion.probability).toBeCloseTo(expected, 15)
    expect(Math.abs(results.establishment[0]!.diffusion.probability - expected)).toBeLessThanOrEqual(16 * EPS * expected)
  })

  it('several releases combine as 1 − (1 − P₁)^R with P₁ the single-release value', () => {
    const single = computeScenarioResults({ recipient: recipient(200, 50), inputs: inputsWith({ animalsPerEvent: 3, events: 1 }, { q: 0.4, s: 0.05, h: 0.5 }) })
    const four = computeScenarioResults({ recipient: recipient(200, 50), inputs: inputsWith({ animalsPerEvent: 3, events: 4, intervalYears: 5 }, { q: 0.4, s: 0.05, h: 0.5 }) })
    const p1 = single.establishment[0]!.diffusion.probability
    expect(four.establishment[0]!.diffusion.singleRelease).toBe(p1)
    expect(four.establishment[0]!.diffusion.probability).toBeCloseTo(1 - (1 - p1) ** 4, 14)
    expect(four.establishment[0]!.releasesCounted).toBe(4)
  })

  it('releases at or after the horizon are not counted', () => {
    const results = computeScenarioResults({ recipient: recipient(200, 50), inputs: inputsWith({ animalsPerEvent: 3, events: 5, intervalYears: 20 }, { q: 0.4, s: 0.05, h: 0.5 }, 50) })
    expect(results.establishment[0]!.releasesCounted).toBe(3) // years 0, 20, 40
  })

  it('the exact chain equals exactFixationProbability when round(Ne) equals the census after release', () => {
    // N + k = 100 = Ne, q = 1: exactly 2 copies at p = 2/200, the chain's own state 2.
    const results = computeScenarioResults({ recipient: recipient(99, 100), inputs: inputsWith({ animalsPerEvent: 1, events: 1 }, { q: 1, s: 0.1, h: 0.5 }) })
    const exact = results.establishment[0]!.exact
    expect(exact.status).toBe('computed')
    const expected = exactFixationProbability({ census: 100, s: 0.1, h: 0.5, copies: 2 })
    if (exact.status !== 'computed') throw new Error('exact chain missing')
    expect(Math.abs(exact.probability - expected)).toBeLessThanOrEqual(1e-12 * expected)
    expect(results.establishment[0]!.headline).toEqual({ probability: exact.probability, method: 'exact' })
  })

  it('2hs beside it equals haldaneApproximation for a fixed number of copies (q = 1)', () => {
    const results = computeScenarioResults({ recipient: recipient(1000, 1000), inputs: inputsWith({ animalsPerEvent: 1, events: 1 }, { q: 1, s: 0.01, h: 0.5 }) })
    const rule = haldaneApproximation({ census: 1001, effectiveSize: 1000, s: 0.01, h: 0.5, copies: 2 })
    const haldane = results.establishment[0]!.haldane
    expect(haldane.probability).toBeCloseTo(rule.saturating, 15)
    expect(haldane.linear).toBeCloseTo(rule.linear, 15)
    expect(haldane.withinValidity).toBe(true)
    const headline = results.establishment[0]!.headline.probability
    expect(haldane.relativeError).toBeCloseTo((rule.saturating - headline) / headline, 12)
  })

  it('the warnings are the engine\'s fixationMethodWarnings for the recipient (plus the 2hs flag when outside its rule)', () => {
    const results = computeScenarioResults({ recipient: recipient(66, 6), inputs: inputsWith({ animalsPerEvent: 2, events: 1 }, { q: 0.5, s: 0.2, h: 0.5 }) })
    expect(results.establishment[0]!.warnings).toEqual([...fixationMethodWarnings({ census: 66, effectiveSize: 6, s: 0.2, h: 0.5 }), 'rule-of-thumb-only'])
  })

  it('time to establishment for a fixed number of copies equals conditionalFixationTime', () => {
    const results = computeScenarioResults({ recipient: recipient(299, 100, 3), inputs: inputsWith({ animalsPerEvent: 1, events: 1 }, { q: 1, s: 0.05, h: 0.5 }, 500) })
    const expected = conditionalFixationTime({ census: 300, effectiveSize: 100, s: 0.05, h: 0.5, copies: 2 })
    const time = results.establishment[0]!.time!
    expect(time.generations).toBeCloseTo(expected, 10)
    expect(time.years).toBeCloseTo(expected * 3, 10)
    expect(time.fromFirstReleaseYears).toBeCloseTo(expected * 3, 10)
  })

  it('a variant outside the engine\'s domain reports an error instead of throwing', () => {
    const inputs = inputsWith({ animalsPerEvent: 2, events: 1 }, { q: 0.5, s: 0.5, h: -3 })
    const results = computeScenarioResults({ recipient: recipient(100, 50), inputs })
    expect(results.establishment[0]!.error).toMatch(/1 \+ h·s > 0/)
    expect(results.establishment[0]!.headline.probability).toBe(0)
  })
})

describe('independent computation: direct summation (mpmath)', () => {
  for (const item of reference.cases) {
    it(`${item.kind}: ${item.name}`, () => {
      const results = computeScenarioResults({
        recipient: recipient(item.census, item.effectiveSize),
        inputs: inputsWith({ animalsPerEvent: item.animals, events: item.releases, intervalYears: 5 }, { q: item.q, s: item.s, h: item.h }),
      })
      const variant = results.establishment[0]!
      const single = item.kind === 'exact' && variant.exact.status === 'computed' ? variant.exact.singleRelease : variant.diffusion.singleRelease
      const total = item.kind === 'exact' && variant.exact.status === 'computed' ? variant.exact.probability : variant.diffusion.probability
      if (item.kind === 'exact') expect(variant.exact.status).toBe('computed')
      const tolerance = reference.tolerance.relative
      expect(Math.abs(single - Number(item.singleRelease))).toBeLessThanOrEqual(tolerance * Number(item.singleRelease))
      expect(Math.abs(total - Number(item.probability))).toBeLessThanOrEqual(tolerance * Number(item.probability))
    })
  }
})

describe('projection', () => {
  it('without action equals inbreedingTrajectory and fitness equals relativeFitness', () => {
    const results = computeScenarioResults({ recipient: recipient(120, 30, 2.5, 0.05), inputs: inputsWith({ animalsPerEvent: 4, events: 3, intervalYears: 5 }, { q: 0.5, s: 0.05, h: 0.5 }, 50) })
    const trajectory = inbreedingTrajectory({ effectiveSize: 30, generations: 20, initialInbreeding: 0.05 })
    expect(results.projection.withoutAction.inbreeding).toEqual(trajectory)
    expect(results.projection.years[20]).toBeCloseTo(50, 12)
    expect(results.projection.withoutAction.fitness[7]).toBe(relativeFitness({ diploidLethalEquivalents: 12, inbreeding: trajectory[7]! }))
    expect(results.projection.withoutAction.heterozygosity[20]).toBeCloseTo((1 - trajectory[20]!) / 0.95, 15)
  })

  it('a release of 2 animals to 18 residents (m = 0.1) gives SCIENCE.md §6.2\'s next-generation F 0.2176875', () => {
    // f_RR = 0.25, Ne = 20, m = 0.1 → 0.2176875 (SCIENCE.md §6.2, §11 row 44).
    const results = computeScenarioResults({ recipient: recipient(18, 20, 1, 0.25), inputs: inputsWith({ animalsPerEvent: 2, events: 1 }, { q: 0.5, s: 0.05, h: 0.5 }, 5) })
    expect(results.projection.withAction.inbreeding[1]).toBeCloseTo(0.2176875, 14)
    expect(results.projection.releases).toEqual([{ year: 0, generation: 1, animals: 2 }])
    // Afterwards plain drift again.
    expect(results.projection.withAction.inbreeding[2]).toBe(inbreedingAfter({ effectiveSize: 20, generations: 1, initialInbreeding: results.projection.withAction.inbreeding[1]! }))
  })

  it('releases enter the generation whose parents they join and lower F below the course without action', () => {
    const results = computeScenarioResults({ recipient: recipient(60, 15, 3), inputs: inputsWith({ animalsPerEvent: 4, events: 3, intervalYears: 5, firstEventYear: 1 }, { q: 0.5, s: 0.05, h: 0.5 }, 30) })
    expect(results.projection.releases.map(release => release.generation)).toEqual([1, 3, 4]) // years 1, 6, 11 with L = 3
    const { withAction, withoutAction } = results.projection
    for (let index = 1; index < withAction.inbreeding.length; index++) {
      expect(withAction.inbreeding[index]!).toBeLessThan(withoutAction.inbreeding[index]!)
    }
    expect(results.projection.atHorizon.fitnessRatio).toBeGreaterThan(1)
  })
})

describe('baseline, migrants and outbreeding', () => {
  it('the "No action" baseline has no establishment and identical courses', () => {
    const results = computeScenarioResults({ recipient: recipient(66, 12, 2.2), inputs: baselineScenarioInputs() })
    expect(results.hasRelease).toBe(false)
    expect(results.establishment).toEqual([])
    expect(results.projection.withAction.inbreeding).toEqual(results.projection.withoutAction.inbreeding)
    expect(results.migrantsPerGeneration.effectiveMigrants).toBe(0)
    expect(results.oneMigrantRule.meets).toBe(false)
  })

  it('effective migrants: 2 animals every 5 years, L = 5, N = 90, Ne = 30 → Ne·m = 30·2/92', () => {
    const results = computeScenarioResults({ recipient: recipient(90, 30, 5), inputs: inputsWith({ animalsPerEvent: 2, events: 4, intervalYears: 5 }, { q: 0.5, s: 0.05, h: 0.5 }) })
    expect(results.migrantsPerGeneration.animalsPerGeneration).toBe(2)
    expect(results.migrantsPerGeneration.effectiveMigrants).toBeCloseTo(60 / 92, 14)
    expect(results.oneMigrantRule.meets).toBe(false)
  })

  it('a one-off release never meets the per-generation rule, however large', () => {
    const results = computeScenarioResults({ recipient: recipient(90, 60, 5), inputs: inputsWith({ animalsPerEvent: 40, events: 1 }, { q: 0.5, s: 0.05, h: 0.5 }) })
    expect(results.migrantsPerGeneration.oneOff).toBe(true)
    expect(results.oneMigrantRule.value).toBeGreaterThan(1)
    expect(results.oneMigrantRule.meets).toBe(false)
  })

  it('outbreeding: null without answers; the engine\'s screen with missing answers counted as unknown', () => {
    const inputs = defaultScenarioInputs(2)
    expect(computeScenarioResults({ recipient: recipient(66, 12, 2.2), inputs }).outbreeding).toBeNull()
    const results = computeScenarioResults({
      recipient: recipient(66, 12, 2.2),
      inputs,
      outbreedingAnswers: { sameSpecies: { value: true }, geneFlowWithin500Years: { value: true }, similarEnvironments: { value: true } },
    })
    const expected = outbreedingRisk({ sameSpecies: true, fixedChromosomalDifferences: 'unknown', geneFlowWithin500Years: true, similarEnvironments: true })
    expect(results.outbreeding).toEqual({ ...expected, answered: 3 })
    expect(results.outbreeding?.level).toBe('elevated')
  })

  it('what-if overrides replace the record figures', () => {
    const inputs: ScenarioInputsLike = { ...defaultScenarioInputs(2), recipientOverrides: { effectiveSize: 40, generationTimeYears: 4 } }
    const results = computeScenarioResults({ recipient: recipient(66, 12, 2.2), inputs })
    expect(results.recipient).toEqual({ census: 66, effectiveSize: 40, generationTimeYears: 4, initialInbreeding: 0 })
  })
})

describe('range over the plausible s and h', () => {
  it('equals the lowest and highest diffusion value over all four corners (two-corner shortcut for h in [0, 1])', () => {
    const cases = [
      { sRange: [0.01, 0.2], hRange: [0.1, 0.9], s: 0.05, h: 0.5 },
      { sRange: [-0.05, -0.01], hRange: [0, 1], s: -0.02, h: 0.5 },
      { sRange: [-0.02, 0.05], hRange: [0.2, 0.8], s: 0.01, h: 0.5 },
      { sRange: [0.02, 0.08], hRange: [-0.5, 1.5], s: 0.05, h: 0.5 },
    ] as const
    for (const item of cases) {
      const inputs = inputsWith({ animalsPerEvent: 3, events: 2 }, { q: 0.4, s: item.s, h: item.h })
      const variant = { ...inputs.variants[0]!, sRange: item.sRange, hRange: item.hRange }
      const results = computeScenarioResults({ recipient: recipient(150, 40), inputs: { ...inputs, variants: [variant] } }, { exactVector: null })
      const values = [results.establishment[0]!.diffusion.probability]
      for (const s of item.sRange) {
        for (const h of item.hRange) {
          values.push(scheduleEstablishment({ census: 150, effectiveSize: 40, s, h, animals: 3, sourceFrequency: 0.4, releases: 2 }))
        }
      }
      expect(results.establishment[0]!.range).toEqual({ low: Math.min(...values), high: Math.max(...values) })
    }
  })
})

describe('time to establishment over the copies distribution', () => {
  it('the top-16 weighted mean stays within 0.05% of the full weighted sum (500 animals, 261 copy numbers)', () => {
    const results = computeScenarioResults({ recipient: recipient(1627, 346, 3), inputs: inputsWith({ animalsPerEvent: 500, events: 1 }, { q: 0.5, s: 0.05, h: 0.3 }, 500) }, { exactVector: null })
    const time = results.establishment[0]!.time!
    // Full direct summation over every copy number j = 1 … 1000, weights P(j)·u(j).
    let weight = 0
    let weighted = 0
    const terms: { copies: number, log: number }[] = []
    for (let copies = 1; copies <= 1000; copies++) {
      const log = binomialLogProbability(1000, copies, 0.5) + Math.log(fixationProbability({ census: 2127, effectiveSize: 346, s: 0.05, h: 0.3, copies }))
      if (Number.isFinite(log)) terms.push({ copies, log })
    }
    const top = Math.max(...terms.map(term => term.log))
    for (const term of terms) {
      const w = Math.exp(term.log - top)
      if (w < 1e-12) continue
      weight += w
      weighted += w * conditionalFixationTime({ census: 2127, effectiveSize: 346, s: 0.05, h: 0.3, copies: term.copies })
    }
    expect(Math.abs(time.generations / (weighted / weight) - 1)).toBeLessThan(5e-4)
  })
})
