/**
 * Pure monitoring helpers: the status from recorded days (shared/review/monitoring-status.ts),
 * the projected courses (shared/review/monitoring-projection.ts) and the waiting-time words.
 * Projection values are checked against Wright's island-model step written out here by hand
 * (SCIENCE.md eq. 4.1–4.2), not through the engine; follow-up interval 365 days is the module's
 * stated rule (common practice, no source).
 */
import { describe, expect, it } from 'vitest'
import { addDays, monitoringStatus } from '../../../shared/review/monitoring-status'
import { plannedReleases, projectMonitoringCourses, yearsBetween } from '../../../shared/review/monitoring-projection'
import { monitoringChartOption, monitoringChartSummary } from '../../../shared/review/monitoring-chart'
import { isLongWait, waitingWords } from '../../../shared/review/waiting'
import { mentionedEmails } from '../../../shared/schemas/review'

describe('monitoringStatus', () => {
  const approved = (movedOn: string[], observedOn: string[], today: string) => monitoringStatus({ proposalStatus: 'approved', movedOn, observedOn, today })

  it('follows the records', () => {
    expect(monitoringStatus({ proposalStatus: 'submitted', movedOn: ['2024-01-01'], observedOn: [], today: '2025-01-01' }).code).toBe('not-applicable')
    expect(approved([], [], '2025-01-01')).toMatchObject({ code: 'awaiting-translocation', nextDueOn: null })
    expect(approved(['2024-05-01'], [], '2025-04-30')).toMatchObject({ code: 'awaiting-follow-up', nextDueOn: '2025-05-01' })
    expect(approved(['2024-05-01'], [], '2025-05-01')).toMatchObject({ code: 'follow-up-due', nextDueOn: '2025-05-01' })
    expect(approved(['2024-05-01'], ['2024-04-01'], '2024-06-01').code).toBe('awaiting-follow-up') // a baseline before the move is not a follow-up
    expect(approved(['2024-05-01'], ['2025-04-20'], '2025-06-01')).toMatchObject({ code: 'monitored', nextDueOn: '2026-04-20' })
    expect(approved(['2024-05-01'], ['2025-04-20'], '2026-04-20').code).toBe('follow-up-due')
    expect(approved(['2024-05-01', '2026-01-10'], ['2025-04-20'], '2026-02-01').code).toBe('awaiting-follow-up') // a new move restarts the clock
  })

  it('adds days across month and leap-year ends', () => {
    expect(addDays('2024-02-28', 1)).toBe('2024-02-29')
    expect(addDays('2024-12-30', 3)).toBe('2025-01-02')
  })
})

describe('projectMonitoringCourses', () => {
  const basis = { census: 40, effectiveSize: 10, generationTimeYears: 2, initialInbreeding: 0.1, initialHeterozygosity: 0.5 }
  /** One generation of Wright's island-model step, by hand. */
  const step = (F: number, Ne: number, m: number) => (1 - m) ** 2 * (1 / (2 * Ne) + (1 - 1 / (2 * Ne)) * F)

  it('matches the recurrence generation by generation, with releases placed in their generation', () => {
    const points = projectMonitoringCourses({
      basis,
      planned: [{ yearOffset: 0, animals: 10 }, { yearOffset: 4, animals: 10 }],
      actual: [{ yearOffset: 0.5, animals: 5 }],
      horizonYears: 8,
    })
    expect(points.map(point => point.yearOffset)).toEqual([0, 2, 4, 6, 8])
    let none = 0.1
    let planned = 0.1
    let actual = 0.1
    for (let generation = 1; generation <= 4; generation++) {
      none = step(none, 10, 0)
      planned = step(planned, 10, generation === 1 || generation === 3 ? 10 / 50 : 0)
      actual = step(actual, 10, generation === 1 ? 5 / 45 : 0)
      const point = points[generation]!
      expect(point.noAction.inbreeding).toBeCloseTo(none, 14)
      expect(point.planned.inbreeding).toBeCloseTo(planned, 14)
      expect(point.actual.inbreeding).toBeCloseTo(actual, 14)
      expect(point.actual.heterozygosity).toBeCloseTo(0.5 * (1 - actual) / 0.9, 14)
      expect(point.census).toBe(40)
    }
    expect(points[0]).toMatchObject({ generation: 0, noAction: { inbreeding: 0.1, heterozygosity: 0.5 } })
  })

  it('shows H relative to the start when no H was observed, and ignores releases before the start or past the horizon', () => {
    const points = projectMonitoringCourses({ basis: { ...basis, initialHeterozygosity: null }, planned: [{ yearOffset: -1, animals: 5 }, { yearOffset: 100, animals: 5 }], actual: [], horizonYears: 4 })
    expect(points[0]!.planned.heterozygosity).toBe(1)
    expect(points[2]!.planned.inbreeding).toBeCloseTo(points[2]!.noAction.inbreeding, 15)
  })

  it('throws the engine\'s RangeError for an effective size outside its domain', () => {
    expect(() => projectMonitoringCourses({ basis: { ...basis, effectiveSize: 0.2 }, planned: [], actual: [], horizonYears: 4 })).toThrow(RangeError)
  })

  it('plans releases from a schedule and measures years between days', () => {
    expect(plannedReleases({ animalsPerEvent: 4, intervalYears: 5, events: 3, firstEventYear: 2 })).toEqual([
      { yearOffset: 2, animals: 4 }, { yearOffset: 7, animals: 4 }, { yearOffset: 12, animals: 4 },
    ])
    expect(plannedReleases(null)).toEqual([])
    expect(plannedReleases({ animalsPerEvent: 4, intervalYears: 5, events: 0 })).toEqual([])
    expect(yearsBetween('2020-01-01', '2020-01-01')).toBe(0)
    expect(yearsBetween('2020-01-01', '2021-01-01')).toBeCloseTo(366 / 365.2425, 14)
    expect(yearsBetween('2020-01-11', '2020-01-01')).toBeLessThan(0)
  })

  it('builds chart options with observed points and a summary sentence', () => {
    const points = projectMonitoringCourses({ basis, planned: [], actual: [{ yearOffset: 0, animals: 5 }], horizonYears: 6 })
    const projection = {
      startOn: '2024-01-01', startKind: 'first-translocation' as const, basis, scenario: null, horizonYears: 6,
      heterozygosityScale: 'absolute' as const, points, plannedReleases: [], actualReleases: [{ yearOffset: 0, animals: 5 }], notes: [],
      observed: [
        { yearOffset: -0.1, observedOn: '2023-12-01', census: 38, heterozygosity: 0.5, inbreeding: 0.1, source: 'baseline' },
        { yearOffset: 2, observedOn: '2026-01-01', census: 45, heterozygosity: 0.48, inbreeding: null, source: 'count' },
      ],
    }
    const option = monitoringChartOption(projection, 'inbreeding') as { series: { name: string, data: [number, number][] }[], xAxis: { min: number } }
    expect(option.series.map(series => series.name)).toEqual(['Projected, no action', 'Projected, as planned', 'Projected, moves made', 'Observed (follow-ups)'])
    expect(option.series[3]!.data).toEqual([[-0.1, 0.1]])
    expect(option.xAxis.min).toBe(-1)
    const census = monitoringChartOption(projection, 'census', { recordCensus: [{ year: 2025, adults: 41 }] }) as { series: { name: string, data: unknown[] }[] }
    expect(census.series.map(series => series.name)).toEqual(['Census the projection assumes', 'Census record', 'Observed (follow-ups)'])
    expect(monitoringChartSummary(projection, 'heterozygosity')).toMatch(/^Heterozygosity H observed 0\.480 after 2\.0 years; projected with the moves made 0\.\d{3}, without action 0\.\d{3}/)
    expect(monitoringChartSummary({ ...projection, observed: [] }, 'census')).toMatch(/nothing observed yet/)
  })
})

describe('waiting words and mentions', () => {
  it('says how long something waited', () => {
    expect(waitingWords(0)).toBe('less than an hour')
    expect(waitingWords(59 * 60_000)).toBe('less than an hour')
    expect(waitingWords(3_600_000)).toBe('1 hour')
    expect(waitingWords(23.9 * 3_600_000)).toBe('23 hours')
    expect(waitingWords(86_400_000)).toBe('1 day')
    expect(waitingWords(17.9 * 86_400_000)).toBe('17 days')
    expect(isLongWait(13.9 * 86_400_000)).toBe(false)
    expect(isLongWait(14 * 86_400_000)).toBe(true)
  })

  it('finds @address mentions, once each, lower-cased, not plain addresses or trailing punctuation', () => {
    expect(mentionedEmails('Thanks @Ann@X.test and (@bo@y.test), not mail@z.test; again @ann@x.test.')).toEqual(['ann@x.test', 'bo@y.test'])
    expect(mentionedEmails('@first@a.test: see this')).toEqual(['first@a.test'])
    expect(mentionedEmails('no mentions @ all, @not-an-address')).toEqual([])
  })
})
