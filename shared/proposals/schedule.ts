/**
 * Release schedules in the units the results use: years of each release, which releases fall
 * inside the horizon, and whether a scenario moves any animals at all.
 */
import type { ScheduleLike } from './types'

/**
 * True when the schedule moves at least one animal: not the "No action" baseline (schedule
 * null) and at least one release of at least one animal.
 *
 * @example scheduleMovesAnimals(null)  // false
 * @example scheduleMovesAnimals({ animalsPerEvent: 4, females: 2, males: 2, intervalYears: 5, events: 3 })  // true
 */
export function scheduleMovesAnimals(schedule: ScheduleLike | null | undefined): schedule is ScheduleLike {
  return Boolean(schedule && schedule.events >= 1 && schedule.animalsPerEvent >= 1)
}

/**
 * Years (from now) of every planned release: firstEventYear + i·intervalYears, i < events.
 *
 * @param schedule - a schedule (null → no releases)
 * @returns release years in increasing order
 * @example releaseYears({ animalsPerEvent: 4, females: 2, males: 2, intervalYears: 5, events: 3, firstEventYear: 1 })  // [1, 6, 11]
 */
export function releaseYears(schedule: ScheduleLike | null | undefined): number[] {
  if (!scheduleMovesAnimals(schedule)) return []
  const first = schedule.firstEventYear ?? 0
  return Array.from({ length: schedule.events }, (_, index) => first + index * schedule.intervalYears)
}

/**
 * Releases that happen before the horizon (year < horizonYears). Later ones cannot affect
 * anything the results show, so they are not counted (and the page says how many were left out).
 *
 * @example releasesBeforeHorizon({ animalsPerEvent: 1, females: 1, males: 0, intervalYears: 20, events: 4 }, 50)  // [0, 20, 40]
 */
export function releasesBeforeHorizon(schedule: ScheduleLike | null | undefined, horizonYears: number): number[] {
  return releaseYears(schedule).filter(year => year < horizonYears)
}
