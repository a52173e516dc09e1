import { domainError, requireFinite, requireInRange, requireInteger, requirePositive } from '../../validate'
import { expandSchedule } from '../schedule'
import type { RescueParams, RescuePopulationParams } from './types'

/** Longest translocation phase accepted, in generations. */
export const MAXIMUM_RESCUE_GENERATIONS = 10_000
/** Largest number of marker or load loci accepted. */
export const MAXIMUM_LOCI = 100_000
/** Default cap on the burn-in length, in generations (see `RescuePopulationParams.burnInGenerations`). */
export const DEFAULT_BURN_IN_CAP = 200

/** Defaults of the harmful-mutation load (all user-editable). */
export const DEFAULT_LOAD = {
  loci: 2000,
  mutationRate: 0.5,
  meanSelection: 0.05,
  selectionShape: 0.3,
  meanDominance: 0.2,
} as const

/** Validated size history of one population. */
export interface PopulationPlan {
  /** Census of burn-in generations 0…B−1 (offspring of generation b form generation b + 1). */
  burnInCensus: Int32Array
  burnInGenerations: number
  /** Census of phase generations 0…G. */
  census: Int32Array
  effectiveRatio: number
}

/** Validated inputs of the individual-based model with defaults filled in. */
export interface RescuePlan {
  generations: number
  recipient: PopulationPlan
  source: PopulationPlan
  markerLoci: number
  load: { loci: number, mutationRate: number, meanSelection: number, selectionShape: number, meanDominance: number } | null
  adaptive: { s: number, h: number, sourceFrequency: number, recipientFrequency: number } | null
  /** 1 where a translocation event happens at the start of the phase generation. */
  eventAt: Uint8Array
  migrantsPerEvent: number
  migrationRate: number
  map: { chromosomes: number, chromosomeLength: number } | null
}

const isCensus = (value: number): boolean => Number.isInteger(value) && value >= 2

function populationPlan(fn: string, name: string, population: RescuePopulationParams, generations: number): PopulationPlan {
  if (typeof population !== 'object' || population === null) domainError(fn, name, 'an object', population)
  const census = Int32Array.from(expandSchedule(fn, `${name}.census`, population.census, generations + 1, isCensus, 'an integer ≥ 2'))
  const effectiveRatio = population.effectiveRatio ?? 1
  requireInRange(fn, `${name}.effectiveRatio`, effectiveRatio, Number.MIN_VALUE, 1)
  const burnInStart = population.burnInCensus === undefined
    ? census[0] ?? 2
    : (typeof population.burnInCensus === 'number' ? population.burnInCensus : population.burnInCensus[0] ?? Number.NaN)
  const burnInGenerations = population.burnInGenerations ?? Math.min(4 * burnInStart, DEFAULT_BURN_IN_CAP)
  requireInteger(fn, `${name}.burnInGenerations`, burnInGenerations, 0)
  if (burnInGenerations > 100 * MAXIMUM_RESCUE_GENERATIONS) domainError(fn, `${name}.burnInGenerations`, `≤ ${100 * MAXIMUM_RESCUE_GENERATIONS}`, burnInGenerations)
  const burnInCensus = Int32Array.from(expandSchedule(
    fn, `${name}.burnInCensus`, population.burnInCensus ?? burnInStart, Math.max(1, burnInGenerations), isCensus, 'an integer ≥ 2',
  ))
  return { burnInCensus, burnInGenerations, census, effectiveRatio }
}

/**
 * Checks `simulateRescue` inputs, fills in defaults and expands schedules.
 *
 * @param fn - public function name for error messages
 * @param params - see `RescueParams`
 * @returns the validated plan
 * @throws RangeError naming the first input outside its domain
 */
export function rescuePlan(fn: string, params: RescueParams): RescuePlan {
  if (typeof params !== 'object' || params === null) domainError(fn, 'params', 'an object', params)
  const { generations } = params
  requireInteger(fn, 'generations', generations, 1)
  if (generations > MAXIMUM_RESCUE_GENERATIONS) domainError(fn, 'generations', `≤ ${MAXIMUM_RESCUE_GENERATIONS}`, generations)
  const recipient = populationPlan(fn, 'recipient', params.recipient, generations)
  const source = populationPlan(fn, 'source', params.source, generations)

  const markerLoci = params.markerLoci ?? 200
  requireInteger(fn, 'markerLoci', markerLoci, 1)
  if (markerLoci > MAXIMUM_LOCI) domainError(fn, 'markerLoci', `≤ ${MAXIMUM_LOCI}`, markerLoci)

  let load: RescuePlan['load'] = null
  if (params.load !== null) {
    const given = params.load ?? {}
    load = {
      loci: given.loci ?? DEFAULT_LOAD.loci,
      mutationRate: given.mutationRate ?? DEFAULT_LOAD.mutationRate,
      meanSelection: given.meanSelection ?? DEFAULT_LOAD.meanSelection,
      selectionShape: given.selectionShape ?? DEFAULT_LOAD.selectionShape,
      meanDominance: given.meanDominance ?? DEFAULT_LOAD.meanDominance,
    }
    requireInteger(fn, 'load.loci', load.loci, 1)
    if (load.loci > MAXIMUM_LOCI) domainError(fn, 'load.loci', `≤ ${MAXIMUM_LOCI}`, load.loci)
    requireInRange(fn, 'load.mutationRate', load.mutationRate, 0, 100)
    requireInRange(fn, 'load.meanSelection', load.meanSelection, Number.MIN_VALUE, 1)
    requirePositive(fn, 'load.selectionShape', load.selectionShape)
    requireInRange(fn, 'load.meanDominance', load.meanDominance, Number.MIN_VALUE, 0.5)
  }

  let adaptive: RescuePlan['adaptive'] = null
  if (params.adaptive) {
    const { s, h, sourceFrequency, recipientFrequency = 0 } = params.adaptive
    requireFinite(fn, 'adaptive.s', s)
    requireFinite(fn, 'adaptive.h', h)
    if (!(1 + s > 0)) domainError(fn, 'adaptive.s', '> −1 (fitness 1 + s must be positive)', s)
    if (!(1 + h * s > 0)) domainError(fn, 'adaptive.h', 'such that 1 + h·s > 0', h)
    requireInRange(fn, 'adaptive.sourceFrequency', sourceFrequency, 0, 1)
    requireInRange(fn, 'adaptive.recipientFrequency', recipientFrequency, 0, 1)
    adaptive = { s, h, sourceFrequency, recipientFrequency }
  }

  const { migrantsPerEvent, eventInterval, events, firstEventGeneration = 0, migrationRate = 0 } = params.translocation ?? {}
  requireInteger(fn, 'translocation.migrantsPerEvent', migrantsPerEvent, 0)
  requireInteger(fn, 'translocation.eventInterval', eventInterval, 1)
  requireInteger(fn, 'translocation.events', events, 0)
  requireInteger(fn, 'translocation.firstEventGeneration', firstEventGeneration, 0)
  requireInRange(fn, 'translocation.migrationRate', migrationRate, 0, 1)
  const eventAt = new Uint8Array(generations)
  for (let event = 0; event < events; event++) {
    const generation = firstEventGeneration + event * eventInterval
    if (generation >= generations) break
    eventAt[generation] = 1
    if (migrantsPerEvent > (source.census[generation] ?? 0)) {
      domainError(fn, 'translocation.migrantsPerEvent', `≤ the source census at generation ${generation}`, migrantsPerEvent)
    }
  }

  let map: RescuePlan['map'] = null
  if (params.map) {
    requireInteger(fn, 'map.chromosomes', params.map.chromosomes, 1)
    requirePositive(fn, 'map.chromosomeLength', params.map.chromosomeLength)
    map = { chromosomes: params.map.chromosomes, chromosomeLength: params.map.chromosomeLength }
  }
  return { generations, recipient, source, markerLoci, load, adaptive, eventAt, migrantsPerEvent, migrationRate, map }
}
