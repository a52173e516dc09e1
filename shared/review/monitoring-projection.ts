/**
 * Observed against projected, for the recipient of an approved proposal: inbreeding F and
 * heterozygosity H projected generation by generation with the releases that were planned
 * (the recommended scenario), with the releases actually made (the translocation records), and
 * with none — beside what follow-up monitoring observed.
 *
 * Model (the same one the proposal workspace projects with; SCIENCE.md §4.1–4.2, §6.2): one step
 * per whole generation t = 1 … G, G = ⌊horizon / L⌋;
 *   - animals released in years [(t − 1)·L, t·L) join the N residents among the parents of
 *     generation t, so immigrant genes make up m_t = a_t / (N + a_t) of that generation;
 *   - F_t = (1 − m_t)²·[1/(2Ne) + (1 − 1/(2Ne))·F_(t−1)] (Wright 1931, island-model step, through
 *     the engine's `inbreedingAfter` for one generation);
 *   - H_t = H_0·(1 − F_t)/(1 − F_0): absolute when a starting heterozygosity H_0 is known (the
 *     earliest observed value), otherwise relative to the start (H_0 = 1).
 * The census line is the N the projection assumes (held constant; the model has no demography).
 * Assumptions: released animals unrelated to the recipient and breeding like residents; Ne and
 * N constant. Years are counted from `startOn` (the first move, or the approval day).
 *
 * Pure: no Date.now — days are passed in as YYYY-MM-DD.
 */
import { inbreedingAfter } from '../genetics'

/** The recipient figures the projection starts from. */
export interface MonitoringBasis {
  /** N, adults, ≥ 1. */
  census: number
  /** Ne per generation, ≥ ½. */
  effectiveSize: number
  /** L, years per generation, > 0. */
  generationTimeYears: number
  /** F_0 relative to the founding base, in [0, 1). */
  initialInbreeding: number
  /** H_0 when known (0–1), else null (H is then shown relative to the start). */
  initialHeterozygosity: number | null
}

/** A release some years after the start. */
export interface ReleaseAt { yearOffset: number, animals: number }

/** One generation of the projection. */
export interface MonitoringProjectionPoint {
  /** Years after the start (t·L). */
  yearOffset: number
  generation: number
  planned: { inbreeding: number, heterozygosity: number }
  actual: { inbreeding: number, heterozygosity: number }
  noAction: { inbreeding: number, heterozygosity: number }
  /** N the projection assumes. */
  census: number
}

/** One observation placed on the projection's time axis. */
export interface ObservedPoint {
  yearOffset: number
  observedOn: string
  census: number | null
  heterozygosity: number | null
  inbreeding: number | null
  source: string
}

export interface MonitoringProjection {
  /** Day 0 of the axis (YYYY-MM-DD). */
  startOn: string
  /** What day 0 is. */
  startKind: 'first-translocation' | 'approval'
  basis: MonitoringBasis
  /** The scenario whose schedule is "planned": the recommended one, else the first that moves animals. */
  scenario: { id: number, name: string, recommended: boolean } | null
  horizonYears: number
  heterozygosityScale: 'absolute' | 'relative'
  points: MonitoringProjectionPoint[]
  observed: ObservedPoint[]
  /** Releases on the axis. */
  plannedReleases: ReleaseAt[]
  actualReleases: ReleaseAt[]
  /** Sentences a reader needs (assumptions, what was taken from where). */
  notes: string[]
}

const DAY_MS = 86_400_000
/** Mean length of a calendar year in days (Gregorian). */
const DAYS_PER_YEAR = 365.2425

/**
 * Years from `startOn` to `day` (negative before the start).
 *
 * @example yearsBetween('2020-01-01', '2021-01-01') // 1.0020739…
 * @example yearsBetween('2020-01-01', '2020-01-01') // 0
 */
export function yearsBetween(startOn: string, day: string): number {
  return (Date.parse(`${day}T00:00:00Z`) - Date.parse(`${startOn}T00:00:00Z`)) / DAY_MS / DAYS_PER_YEAR
}

/**
 * Release years of a regular schedule: firstEventYear + k·interval for k = 0 … events − 1.
 *
 * @example plannedReleases({ animalsPerEvent: 4, intervalYears: 5, events: 3, firstEventYear: 0 }) // [{0,4},{5,4},{10,4}]
 */
export function plannedReleases(schedule: { animalsPerEvent: number, intervalYears: number, events: number, firstEventYear?: number } | null): ReleaseAt[] {
  if (!schedule || schedule.events <= 0 || schedule.animalsPerEvent <= 0) return []
  const releases: ReleaseAt[] = []
  for (let event = 0; event < schedule.events; event++) {
    releases.push({ yearOffset: (schedule.firstEventYear ?? 0) + event * schedule.intervalYears, animals: schedule.animalsPerEvent })
  }
  return releases
}

/** F per generation 0 … G with `releases` (animals per generation step). */
function inbreedingCourse(basis: MonitoringBasis, releases: readonly ReleaseAt[], generations: number): number[] {
  const animalsByGeneration = new Float64Array(generations + 1)
  for (const release of releases) {
    if (release.yearOffset < 0) continue
    const generation = Math.floor(release.yearOffset / basis.generationTimeYears) + 1
    if (generation <= generations) animalsByGeneration[generation] = (animalsByGeneration[generation] ?? 0) + release.animals
  }
  const course = [basis.initialInbreeding]
  let previous = basis.initialInbreeding
  for (let generation = 1; generation <= generations; generation++) {
    const animals = animalsByGeneration[generation] ?? 0
    const migrationRate = animals > 0 ? animals / (basis.census + animals) : 0
    previous = inbreedingAfter({ effectiveSize: basis.effectiveSize, generations: 1, initialInbreeding: previous, migrationRate })
    course.push(previous)
  }
  return course
}

/**
 * The three projected courses, one point per whole generation from the start to the horizon.
 *
 * @param input.basis - recipient figures at the start
 * @param input.planned - releases of the approved plan (years after the start)
 * @param input.actual - releases actually made (years after the start)
 * @param input.horizonYears - years to project, > 0 (at most 2 000 generations are drawn)
 * @returns points from generation 0 (the start) to ⌊horizon / L⌋
 * @throws RangeError (from the engine) when a figure is outside its domain
 * @example projectMonitoringCourses({ basis: { census: 40, effectiveSize: 10, generationTimeYears: 2, initialInbreeding: 0, initialHeterozygosity: null }, planned: [], actual: [], horizonYears: 2 })[1].noAction.inbreeding // 0.05
 */
export function projectMonitoringCourses(input: { basis: MonitoringBasis, planned: readonly ReleaseAt[], actual: readonly ReleaseAt[], horizonYears: number }): MonitoringProjectionPoint[] {
  const { basis } = input
  const generations = Math.min(2000, Math.max(0, Math.floor(input.horizonYears / basis.generationTimeYears + 1e-9)))
  const planned = inbreedingCourse(basis, input.planned, generations)
  const actual = inbreedingCourse(basis, input.actual, generations)
  const none = inbreedingCourse(basis, [], generations)
  const startH = basis.initialHeterozygosity ?? 1
  const heterozygosity = (F: number) => startH * (1 - F) / (1 - basis.initialInbreeding)
  const points: MonitoringProjectionPoint[] = []
  for (let generation = 0; generation <= generations; generation++) {
    const at = (course: number[]) => {
      const F = course[generation] ?? basis.initialInbreeding
      return { inbreeding: F, heterozygosity: heterozygosity(F) }
    }
    points.push({
      yearOffset: generation * basis.generationTimeYears,
      generation,
      planned: at(planned),
      actual: at(actual),
      noAction: at(none),
      census: basis.census,
    })
  }
  return points
}
