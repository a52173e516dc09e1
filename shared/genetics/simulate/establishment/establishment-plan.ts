import { domainError, requireFinite, requireInRange, requireInteger } from '../../validate'
import { expandSchedule } from '../schedule'
import type { EstablishmentParams } from './types'

/** Longest horizon accepted, in generations (keeps per-generation tables small). */
export const MAXIMUM_GENERATIONS = 1_000_000

/** Validated inputs of the allele-frequency model, expanded per generation. */
export interface EstablishmentPlan {
  generations: number
  /** Census of each generation, 2N used for p0 and for mixing. */
  census: Float64Array
  /** Genes sampled by Wright–Fisher drift from each generation to the next: max(1, round(2·Ne)). */
  sampledGenes: Int32Array
  /** 1 where a translocation event happens at the start of the generation. */
  eventAt: Uint8Array
  s: number
  h: number
  sourceFrequency: number
  /** Exact copies per event, or −1 to draw Binomial(2k, q). */
  introducedCopies: number
  migrantsPerEvent: number
  migrationRate: number
  /** Generation from which times are measured (the first event, or 0 without events). */
  timeOrigin: number
  /** Last generation at which A can still arrive; Infinity under continuing migration with q > 0. */
  lastInputGeneration: number
}

/**
 * Checks `simulateEstablishment` inputs and expands the schedules.
 *
 * @param fn - calling function's name, for error messages
 * @param params - model inputs (see `EstablishmentParams`)
 * @returns the per-generation plan
 * @throws RangeError naming the first input outside its domain
 */
export function establishmentPlan(fn: string, params: EstablishmentParams): EstablishmentPlan {
  const {
    census, effectiveSize, s, h, sourceFrequency, introducedCopies, migrantsPerEvent,
    eventInterval, events, migrationRate = 0, generations, firstEventGeneration = 0,
  } = params
  requireInteger(fn, 'generations', generations, 1)
  if (generations > MAXIMUM_GENERATIONS) domainError(fn, 'generations', `≤ ${MAXIMUM_GENERATIONS}`, generations)
  requireFinite(fn, 's', s)
  requireFinite(fn, 'h', h)
  if (!(1 + s > 0)) domainError(fn, 's', '> −1 (fitness 1 + s must be positive)', s)
  if (!(1 + h * s > 0)) domainError(fn, 'h', 'such that 1 + h·s > 0', h)
  requireInteger(fn, 'migrantsPerEvent', migrantsPerEvent, 0)
  requireInteger(fn, 'eventInterval', eventInterval, 1)
  requireInteger(fn, 'events', events, 0)
  requireInteger(fn, 'firstEventGeneration', firstEventGeneration, 0)
  requireInRange(fn, 'migrationRate', migrationRate, 0, 1)

  const censusByGeneration = expandSchedule(fn, 'census', census, generations, v => Number.isInteger(v) && v >= 1, 'an integer ≥ 1')
  const effectiveByGeneration = expandSchedule(fn, 'effectiveSize', effectiveSize, generations, v => Number.isFinite(v) && v > 0, 'a finite number > 0')
  const sampledGenes = new Int32Array(generations)
  for (let generation = 0; generation < generations; generation++) {
    sampledGenes[generation] = Math.max(1, Math.round(2 * (effectiveByGeneration[generation] ?? 1)))
  }

  let copies = -1
  let frequency: number
  if (introducedCopies !== undefined) {
    requireInteger(fn, 'introducedCopies', introducedCopies, 0)
    if (migrantsPerEvent > 0 && introducedCopies > 2 * migrantsPerEvent) {
      domainError(fn, 'introducedCopies', `≤ 2·migrantsPerEvent (${2 * migrantsPerEvent})`, introducedCopies)
    }
    copies = introducedCopies
    if (sourceFrequency !== undefined) requireInRange(fn, 'sourceFrequency', sourceFrequency, 0, 1)
    frequency = sourceFrequency ?? 0
    if (migrationRate > 0 && sourceFrequency === undefined) {
      domainError(fn, 'sourceFrequency', 'given when migrationRate > 0', sourceFrequency)
    }
  } else {
    if (sourceFrequency === undefined) domainError(fn, 'sourceFrequency', 'given unless introducedCopies is', sourceFrequency)
    requireInRange(fn, 'sourceFrequency', sourceFrequency, 0, 1)
    if (migrantsPerEvent === 0 && events > 0) domainError(fn, 'migrantsPerEvent', '≥ 1 when copies are drawn from sourceFrequency', migrantsPerEvent)
    frequency = sourceFrequency
  }

  const eventAt = new Uint8Array(generations)
  let lastEvent = -1
  for (let event = 0; event < events; event++) {
    const generation = firstEventGeneration + event * eventInterval
    if (generation >= generations) break
    eventAt[generation] = 1
    lastEvent = generation
    if (copies > 0 && migrantsPerEvent === 0 && copies > 2 * (censusByGeneration[generation] ?? 0)) {
      domainError(fn, 'introducedCopies', `≤ 2·census at generation ${generation}`, copies)
    }
  }
  const continuingInput = migrationRate > 0 && frequency > 0
  return {
    generations,
    census: censusByGeneration,
    sampledGenes,
    eventAt,
    s,
    h,
    sourceFrequency: frequency,
    introducedCopies: copies,
    migrantsPerEvent,
    migrationRate,
    timeOrigin: events > 0 ? firstEventGeneration : 0,
    lastInputGeneration: continuingInput ? Infinity : lastEvent,
  }
}
