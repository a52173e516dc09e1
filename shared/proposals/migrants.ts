/**
 * A release schedule on the scale of the one-migrant-per-generation rule of thumb.
 *
 * Animals per generation while releases continue: k·L / interval (k animals every `interval`
 * years, L years per generation); a single release is a one-off pulse of k animals. Their share
 * of the breeding genes is m = a / (N + a) (released animals breed like residents — assumed),
 * and the effective migrants per generation are Ne·m (`migrantsPerGeneration`, island model,
 * SCIENCE.md §4.2–4.3). The rule (Mills & Allendorf 1996) asks for at least 1 and at most 10
 * effective migrants per generation as continuing gene flow; fluctuating populations need more
 * (Vucetich & Waite 2000). A one-off release never "meets" a per-generation rule.
 */
import { migrantsPerGeneration, ONE_MIGRANT_PER_GENERATION_RULE } from '../genetics'
import { scheduleMovesAnimals } from './schedule'
import type { MigrantsSummary, OneMigrantRuleCheck, RecipientFigures, ScheduleLike } from './types'

/**
 * Effective migrants per generation of a schedule.
 *
 * @param recipient - N, Ne and L
 * @param schedule - the releases, or null
 * @returns animals per generation, m, Ne·m, and whether it is a one-off release
 * @example migrantsSummary({ census: 90, effectiveSize: 30, generationTimeYears: 5, initialInbreeding: 0 },
 *   { animalsPerEvent: 2, females: 1, males: 1, intervalYears: 5, events: 4 })
 *   // { animalsPerGeneration: 2, migrationRate: 0.021739130434782608, effectiveMigrants: 0.6521739130434783, oneOff: false }
 */
export function migrantsSummary(recipient: RecipientFigures, schedule: ScheduleLike | null): MigrantsSummary {
  if (!scheduleMovesAnimals(schedule)) return { animalsPerGeneration: 0, migrationRate: 0, effectiveMigrants: 0, oneOff: false }
  const oneOff = schedule.events === 1
  const animalsPerGeneration = oneOff
    ? schedule.animalsPerEvent
    : schedule.animalsPerEvent * recipient.generationTimeYears / schedule.intervalYears
  const migrationRate = animalsPerGeneration / (recipient.census + animalsPerGeneration)
  return {
    animalsPerGeneration,
    migrationRate,
    effectiveMigrants: migrantsPerGeneration({ effectiveSize: recipient.effectiveSize, migrationRate }),
    oneOff,
  }
}

/**
 * Compares effective migrants per generation with the rule of thumb.
 *
 * @param summary - from `migrantsSummary`
 * @returns the value, the rule's bounds, whether it meets the minimum as continuing gene flow,
 *   and whether it is above the suggested maximum
 * @example oneMigrantRuleCheck({ animalsPerGeneration: 2, migrationRate: 0.0217, effectiveMigrants: 0.652, oneOff: false })
 *   // { value: 0.652, minimum: 1, maximum: 10, meets: false, aboveMaximum: false }
 */
export function oneMigrantRuleCheck(summary: MigrantsSummary): OneMigrantRuleCheck {
  const minimum = ONE_MIGRANT_PER_GENERATION_RULE.minimumEffectiveMigrants
  const maximum = ONE_MIGRANT_PER_GENERATION_RULE.maximumEffectiveMigrants
  return {
    value: summary.effectiveMigrants,
    minimum,
    maximum,
    meets: !summary.oneOff && summary.effectiveMigrants >= minimum,
    aboveMaximum: summary.effectiveMigrants > maximum,
  }
}
