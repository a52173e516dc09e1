/**
 * The Atlas status scale (shared/atlas/status.ts, shared/atlas/working-effective-size.ts).
 * Thresholds are a product choice (see the file comment there); the Ne at each boundary
 * follows from Wright's F_t = 1 − (1 − 1/(2Ne))^t, checked against SCIENCE.md values.
 */
import { describe, expect, it } from 'vitest'
import {
  NE_BANDS, STATUS_HORIZON_GENERATIONS, STATUS_LEVELS, neBandFor, projectedInbreeding, statusLevelFor,
} from '../../../shared/atlas/status'
import { subpopulationStatus, workingEffectiveSize, type EffectiveSizeInputs } from '../../../shared/atlas/working-effective-size'

const EPS = Number.EPSILON

/** Ne at which F after t generations equals target: Ne = 1 / (2[1 − (1 − F)^(1/t)]) (SCIENCE.md §6.4). */
function effectiveSizeFor(target: number, generations = 10): number {
  return 1 / (2 * (1 - (1 - target) ** (1 / generations)))
}

describe('projected inbreeding after 10 generations', () => {
  it('matches SCIENCE.md §4.1 check values (Ne = 50 → 0.0956179249912; Ne = 100, t = 5 → 0.0247512468781)', () => {
    // Values typed from SCIENCE.md §4.1 ([computed], 12 significant digits): half a unit of the last digit.
    expect(Math.abs(projectedInbreeding(50) - 0.0956179249912)).toBeLessThan(5e-14)
    expect(Math.abs(projectedInbreeding(100, 5) - 0.0247512468781)).toBeLessThan(5e-14)
    expect(STATUS_HORIZON_GENERATIONS).toBe(10)
  })

  it('SCIENCE.md §6.4: F* = 0.1 over 10 generations needs Ne = 47.71', () => {
    expect(Math.abs(effectiveSizeFor(0.1) - 47.71)).toBeLessThan(0.005)
  })
})

describe('status levels (product thresholds 0.10 / 0.05 / 0.01 / 0.005)', () => {
  it('orders the five levels from worst to best, with words for each', () => {
    expect(STATUS_LEVELS.map(level => level.key)).toEqual(['critical', 'declining', 'watch', 'stable', 'connected'])
    expect(STATUS_LEVELS.map(level => level.label)).toEqual(['Losing diversity fast', 'Declining', 'Watch', 'Stable', 'Well connected'])
    expect(STATUS_LEVELS.map(level => level.minimumProjectedInbreeding)).toEqual([0.10, 0.05, 0.01, 0.005, 0])
  })

  it('puts each boundary in the worse level and the value just below it in the better one', () => {
    const boundaries: [number, string, string][] = [[0.10, 'critical', 'declining'], [0.05, 'declining', 'watch'], [0.01, 'watch', 'stable'], [0.005, 'stable', 'connected']]
    for (const [threshold, at, below] of boundaries) {
      expect(statusLevelFor(threshold).key).toBe(at)
      expect(statusLevelFor(threshold * (1 - 4 * EPS)).key).toBe(below)
    }
    expect(statusLevelFor(1).key).toBe('critical')
    expect(statusLevelFor(0).key).toBe('connected')
  })

  it('places the boundaries near the Ne of the 50/100/500/1000 rules of common practice', () => {
    // The boundary Ne values follow from the thresholds; the legend quotes them rounded.
    expect(effectiveSizeFor(0.10)).toBeCloseTo(47.71, 2)
    expect(effectiveSizeFor(0.05)).toBeCloseTo(97.73, 2)
    expect(effectiveSizeFor(0.01)).toBeCloseTo(497.75, 2)
    expect(effectiveSizeFor(0.005)).toBeCloseTo(997.75, 2)
    // Just either side of each boundary Ne the level changes.
    const sides: [number, string, string][] = [[effectiveSizeFor(0.10), 'critical', 'declining'], [effectiveSizeFor(0.05), 'declining', 'watch'], [effectiveSizeFor(0.01), 'watch', 'stable'], [effectiveSizeFor(0.005), 'stable', 'connected']]
    for (const [ne, smaller, larger] of sides) {
      expect(statusLevelFor(projectedInbreeding(ne * 0.999)).key).toBe(smaller)
      expect(statusLevelFor(projectedInbreeding(ne * 1.001)).key).toBe(larger)
    }
  })

  it('the legend sentences quote the same Ne figures', () => {
    expect(STATUS_LEVELS[0]?.description).toMatch(/about 48/)
    expect(STATUS_LEVELS[1]?.description).toMatch(/48 to 98/)
    expect(STATUS_LEVELS[2]?.description).toMatch(/98 to 498/)
    expect(STATUS_LEVELS[3]?.description).toMatch(/498 to 998/)
    expect(STATUS_LEVELS[4]?.description).toMatch(/about 998/)
  })
})

describe('Ne bands (marker size)', () => {
  it('start at 0, 50, 100, 500 and 1000 with growing markers', () => {
    expect(NE_BANDS.map(band => band.minimum)).toEqual([0, 50, 100, 500, 1000])
    const radii = NE_BANDS.map(band => band.radius)
    expect([...radii].sort((a, b) => a - b)).toEqual(radii)
    expect(neBandFor(0).key).toBe('under-50')
    expect(neBandFor(49.999).key).toBe('under-50')
    expect(neBandFor(50).key).toBe('50-99')
    expect(neBandFor(99.9).key).toBe('50-99')
    expect(neBandFor(100).key).toBe('100-499')
    expect(neBandFor(999).key).toBe('500-999')
    expect(neBandFor(1000).key).toBe('1000-plus')
    expect(neBandFor(1e7).key).toBe('1000-plus')
  })
})

const none: EffectiveSizeInputs = { workingNe: null, workingNeReason: null, latestEstimate: null, latestCensus: null }

describe('working effective size', () => {
  it('prefers the working Ne the team chose, with its reason', () => {
    const chosen = workingEffectiveSize({ ...none, workingNe: 346, workingNeReason: 'Ne/N estimate', latestEstimate: { method: 'sex-ratio', value: 1365.6, estimatedOn: '2024-11-09' }, latestCensus: { year: 2024, adults: 1627 } })
    expect(chosen).toEqual({ value: 346, basis: 'working', method: null, note: 'Chosen by the team: Ne/N estimate' })
  })

  it('then the latest estimate, naming its method and date', () => {
    const estimate = workingEffectiveSize({ ...none, latestEstimate: { method: 'harmonic-mean', value: 534.2, estimatedOn: '2025-01-03' }, latestCensus: { year: 2024, adults: 686 } })
    expect(estimate).toMatchObject({ value: 534.2, basis: 'estimate', method: 'harmonic-mean' })
    expect(estimate.note).toBe('Latest estimate of 2025-01-03 (harmonic mean over the census series); no working Ne chosen yet.')
  })

  it('then 0.1 × the latest census, with a note (SCIENCE.md §5 engine default)', () => {
    const census = workingEffectiveSize({ ...none, latestCensus: { year: 2023, adults: 134 } })
    expect(census).toMatchObject({ value: 13.4, basis: 'census-ratio', method: null })
    expect(census.note).toMatch(/0\.1 × the 2023 census of 134 adults/)
    expect(subpopulationStatus(census).caveat).toMatch(/assumed from the census/)
  })

  it('else nothing, and the status is unknown', () => {
    const nothing = workingEffectiveSize(none)
    expect(nothing).toMatchObject({ value: null, basis: 'none' })
    expect(subpopulationStatus(nothing)).toMatchObject({ key: 'unknown', projectedInbreeding: null, neBand: null })
  })
})

describe('subpopulation status', () => {
  it('projects F at the working Ne and names level and band', () => {
    const status = subpopulationStatus({ value: 50, basis: 'estimate' })
    expect(status.key).toBe('declining')
    expect(status.label).toBe('Declining')
    expect(status.neBand).toBe('50-99')
    expect(status.generations).toBe(10)
    expect(Math.abs((status.projectedInbreeding ?? 0) - 0.0956179249912)).toBeLessThan(5e-14)
  })

  it('edge cases: a census of no adults is unknown; Ne below ½ is critical without a projection', () => {
    expect(subpopulationStatus({ value: 0, basis: 'census-ratio' })).toMatchObject({ key: 'unknown', caveat: 'The latest census counted no adults.' })
    expect(subpopulationStatus({ value: 0.3, basis: 'census-ratio' })).toMatchObject({ key: 'critical', projectedInbreeding: null, neBand: 'under-50' })
    expect(subpopulationStatus({ value: 0.5, basis: 'working' })).toMatchObject({ key: 'critical', projectedInbreeding: 1 })
    expect(subpopulationStatus({ value: Number.NaN, basis: 'working' }).key).toBe('unknown')
  })

  it('is monotone: a larger Ne never has a worse level', () => {
    const order = ['critical', 'declining', 'watch', 'stable', 'connected']
    let previous = 0
    for (let ne = 0.5; ne < 5000; ne *= 1.07) {
      const rank = order.indexOf(subpopulationStatus({ value: ne, basis: 'working' }).key)
      expect(rank).toBeGreaterThanOrEqual(previous)
      previous = rank
    }
    expect(previous).toBe(4)
  })
})
