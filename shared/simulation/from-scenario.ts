/**
 * A scenario's inputs (release schedule in years, adaptive variants, recipient figures with
 * what-if overrides) as parameters of the two simulation models, so a biologist can start a
 * simulation run from the scenario they are editing.
 *
 * Years → generations: with L years per generation (the recipient's generation time), the
 * horizon is ⌈horizonYears / L⌉ generations, the first release falls in generation
 * round(firstEventYear / L) and releases are round(intervalYears / L) generations apart (at least
 * 1: the models have discrete, non-overlapping generations, so two releases within one
 * generation are simulated one generation apart — a note says so).
 *
 * Establishment (allele-frequency model): the recipient's census N and Ne (constant), the
 * chosen variant's s, h and source frequency q, k = animals per release. Rescue (individual-
 * based model): the recipient's census with target Ne/N = min(1, Ne/N), the source's census and
 * Ne/N from its record, the variant as the adaptive locus, and the engine's default load of
 * harmful mutations (a mutation model, burned in to each population's own size; the scenario's
 * lethal-equivalent figure is not an input of that model — a note says so).
 *
 * Pure: no Vue or server imports; the run panel calls it in the browser.
 */
import type { EstablishmentParams, RescueParams } from '../genetics/simulate'
import { resolveRecipient, type RecipientRecord } from '../proposals/recipient'
import type { RecipientFigures, ScenarioInputsLike } from '../proposals/types'
import { SIMULATION_LIMITS } from '../schemas/simulation-run'

/** What the mapping needs: the scenario's inputs and the records of its recipient and source. */
export interface ScenarioSimulationInput {
  inputs: ScenarioInputsLike
  /** The recipient's record figures (census, working Ne, generation time). */
  recipient: RecipientRecord
  /** The scenario's source record; null for none (captive source, or not chosen). */
  source: RecipientRecord | null
  /** Which of the scenario's variants is simulated, default 0 (the first). */
  variantIndex?: number
}

/** Times of the scenario in generations. */
export interface GenerationTimes {
  /** Years per generation used. */
  generationTimeYears: number
  generations: number
  firstEventGeneration: number
  eventInterval: number
  /** Releases that fall inside the horizon. */
  events: number
}

/** The mapping's answer: parameters (or null with the problems that prevent a run) and notes. */
export interface ScenarioSimulation<P> {
  parameters: P | null
  /** Why the model cannot run for this scenario (plain sentences). */
  problems: string[]
  /** What was assumed or rounded on the way (plain sentences). */
  notes: string[]
}

const plural = (count: number, one: string, many = `${one}s`): string => `${count} ${count === 1 ? one : many}`
const every = (count: number, unit: string): string => (count === 1 ? `every ${unit}` : `every ${count} ${unit}s`)

/**
 * Largest source the individual-based model simulates at its recorded size; a larger source is
 * simulated as this many animals with its own Ne/N (a note says so). Why: the cost of a
 * generation grows with N² (the pedigree), and a large source drifts little over a horizon of
 * decades, so its burned-in load and diversity change little with its exact size.
 */
export const SIMULATED_SOURCE_CAP = 1000
const years = (value: number): string => `${Number(value.toPrecision(3))} ${value === 1 ? 'year' : 'years'}`

/**
 * The scenario's horizon and release schedule in generations.
 *
 * @param inputs - scenario inputs (schedule in years, horizon in years)
 * @param generationTimeYears - L, years per generation, > 0
 * @returns generations, first release generation, interval (≥ 1) and the releases inside the
 *   horizon, with notes on any rounding; null schedule → 0 events
 * @example scenarioGenerations({ schedule: { animalsPerEvent: 4, females: 2, males: 2, intervalYears: 5, events: 3, firstEventYear: 0 }, variants: [], load: { diploidLethalEquivalents: 12, range: [3, 30], citation: 'custom' }, horizonYears: 50 }, 2.5).times
 *   // { generationTimeYears: 2.5, generations: 20, firstEventGeneration: 0, eventInterval: 2, events: 3 }
 */
export function scenarioGenerations(inputs: ScenarioInputsLike, generationTimeYears: number): { times: GenerationTimes, notes: string[] } {
  const notes: string[] = []
  const generations = Math.max(1, Math.ceil(inputs.horizonYears / generationTimeYears - 1e-9))
  const schedule = inputs.schedule
  if (!schedule || schedule.events < 1) {
    return { times: { generationTimeYears, generations, firstEventGeneration: 0, eventInterval: 1, events: 0 }, notes }
  }
  const firstYear = schedule.firstEventYear ?? 0
  const firstEventGeneration = Math.round(firstYear / generationTimeYears)
  const exactInterval = schedule.intervalYears / generationTimeYears
  const eventInterval = Math.max(1, Math.round(exactInterval))
  if (Math.abs(eventInterval - exactInterval) > 1e-9 && schedule.events > 1) {
    notes.push(`Releases every ${years(schedule.intervalYears)} are simulated ${every(eventInterval, 'generation')} (${years(eventInterval * generationTimeYears)} at ${years(generationTimeYears)} per generation).`)
  }
  if (Math.abs(firstEventGeneration * generationTimeYears - firstYear) > 1e-9) {
    notes.push(`The first release (year ${Number(firstYear.toPrecision(3))}) is simulated in generation ${firstEventGeneration}.`)
  }
  let events = 0
  for (let event = 0; event < schedule.events; event++) {
    if (firstEventGeneration + event * eventInterval < generations) events++
  }
  if (events < schedule.events) {
    notes.push(`${plural(schedule.events - events, 'release')} after the ${years(inputs.horizonYears)} horizon ${schedule.events - events === 1 ? 'is' : 'are'} left out.`)
  }
  return { times: { generationTimeYears, generations, firstEventGeneration, eventInterval, events }, notes }
}

/** Recipient figures with overrides, or the problems. */
function recipientFigures(input: ScenarioSimulationInput, problems: string[]): RecipientFigures | null {
  const resolved = resolveRecipient(input.recipient, input.inputs.recipientOverrides)
  problems.push(...resolved.problems)
  return resolved.figures
}

/** The chosen variant, or a problem. */
function chosenVariant(input: ScenarioSimulationInput, problems: string[]) {
  const index = input.variantIndex ?? 0
  const variant = input.inputs.variants[index]
  if (!variant) problems.push(input.inputs.variants.length === 0 ? 'The scenario has no adaptive variant to follow: add one.' : `The scenario has no variant number ${index + 1}.`)
  return variant ?? null
}

/**
 * Parameters of the allele-frequency model (`simulateEstablishment`) for a scenario.
 *
 * @param input - scenario inputs with the recipient record (source record unused)
 * @returns parameters, or null with problems (no release schedule, no variant, missing census,
 *   Ne or generation time); notes on rounding
 * @example establishmentFromScenario({ inputs: { schedule: { animalsPerEvent: 4, females: 2, males: 2, intervalYears: 5, events: 3, firstEventYear: 0 }, variants: [{ name: 'A', sourceFrequency: 0.5, s: 0.05, sRange: [0.01, 0.1], h: 0.5, hRange: [0.1, 0.9] }], load: { diploidLethalEquivalents: 12, range: [3, 30], citation: 'custom' }, horizonYears: 50 }, recipient: { latestCensus: { year: 2024, adults: 60 }, workingNe: 15, generationTimeYears: 2.5 }, source: null }).parameters
 *   // { census: 60, effectiveSize: 15, s: 0.05, h: 0.5, sourceFrequency: 0.5, migrantsPerEvent: 4, eventInterval: 2, events: 3, firstEventGeneration: 0, migrationRate: 0, generations: 20 }
 */
export function establishmentFromScenario(input: ScenarioSimulationInput): ScenarioSimulation<EstablishmentParams> {
  const problems: string[] = []
  const schedule = input.inputs.schedule
  if (!schedule || schedule.events < 1 || schedule.animalsPerEvent < 1) {
    problems.push('This scenario moves no animals (the "No action" baseline): there is nothing to establish.')
  }
  const figures = recipientFigures(input, problems)
  const variant = chosenVariant(input, problems)
  if (problems.length > 0 || !figures || !variant || !schedule) return { parameters: null, problems, notes: [] }
  const { times, notes } = scenarioGenerations(input.inputs, figures.generationTimeYears)
  if (times.events === 0) {
    return { parameters: null, problems: [`No release falls within the ${years(input.inputs.horizonYears)} horizon.`], notes }
  }
  return {
    parameters: {
      census: figures.census,
      effectiveSize: figures.effectiveSize,
      s: variant.s,
      h: variant.h,
      sourceFrequency: variant.sourceFrequency,
      migrantsPerEvent: schedule.animalsPerEvent,
      eventInterval: times.eventInterval,
      events: times.events,
      firstEventGeneration: times.firstEventGeneration,
      migrationRate: 0,
      generations: times.generations,
    },
    problems: [],
    notes,
  }
}

/** Census and target Ne/N of a population for the individual-based model, or problems. */
function populationOf(label: string, census: number | null, effectiveSize: number | null, problems: string[], notes: string[]): { census: number, effectiveRatio: number } | null {
  if (census === null) {
    problems.push(`The ${label} has no census count: the individual-based model needs one.`)
    return null
  }
  const cap = label === 'source' ? SIMULATED_SOURCE_CAP : SIMULATION_LIMITS.rescue.census
  if (!Number.isInteger(census) || census < 2) problems.push(`The ${label}'s census must be at least 2 animals for the individual-based model (got ${census}).`)
  let effectiveRatio = 1
  if (effectiveSize !== null && effectiveSize > 0) {
    effectiveRatio = Math.min(1, effectiveSize / census)
    if (effectiveSize > census) notes.push(`The ${label}'s Ne (${Number(effectiveSize.toPrecision(3))}) is above its census; the model uses Ne/N = 1.`)
  } else {
    notes.push(`The ${label} has no effective size; the model uses Ne/N = 1.`)
  }
  effectiveRatio = Number(effectiveRatio.toPrecision(12))
  if (census > cap) {
    if (label !== 'source') {
      problems.push(`The individual-based model handles at most ${cap.toLocaleString('en-US')} animals per population; the ${label} has ${census.toLocaleString('en-US')}.`)
      return { census, effectiveRatio }
    }
    notes.push(`The source (${census.toLocaleString('en-US')} animals) is simulated as ${cap.toLocaleString('en-US')} animals with the same Ne/N: a large source changes little over the horizon, and the model's cost grows with the square of the population size.`)
    return { census: cap, effectiveRatio }
  }
  return { census, effectiveRatio }
}

/**
 * Parameters of the individual-based model (`simulateRescue`) for a scenario: recipient and
 * source populations from their records, the release schedule, the chosen variant as the
 * adaptive locus (none when the scenario has no variant), default markers and load.
 *
 * @param input - scenario inputs with the recipient and source records
 * @returns parameters, or null with problems (no schedule, no source census, populations
 *   outside the model's size limits, missing recipient figures); notes on what was assumed
 * @example rescueFromScenario({ inputs, recipient: { latestCensus: { year: 2024, adults: 60 }, workingNe: 15, generationTimeYears: 2.5 }, source: { latestCensus: { year: 2023, adults: 400 }, workingNe: 120, generationTimeYears: 2.5 } }).parameters?.recipient
 *   // { census: 60, effectiveRatio: 0.25 }
 */
export function rescueFromScenario(input: ScenarioSimulationInput): ScenarioSimulation<RescueParams> {
  const problems: string[] = []
  const notes: string[] = []
  const schedule = input.inputs.schedule
  if (!schedule || schedule.events < 1 || schedule.animalsPerEvent < 1) {
    problems.push('This scenario moves no animals (the "No action" baseline): there is no rescue to simulate.')
  }
  const figures = recipientFigures(input, problems)
  if (!input.source) problems.push('Choose a wild source with a census count: the individual-based model simulates the source population too.')
  const recipient = figures ? populationOf('recipient', figures.census, figures.effectiveSize, problems, notes) : null
  const source = input.source ? populationOf('source', input.source.latestCensus?.adults ?? null, input.source.workingNe, problems, notes) : null
  if (schedule && source && schedule.animalsPerEvent > source.census) {
    problems.push(`Each release takes ${schedule.animalsPerEvent} animals but the source has ${source.census}.`)
  }
  if (problems.length > 0 || !figures || !recipient || !source || !schedule) return { parameters: null, problems, notes }
  const { times, notes: timeNotes } = scenarioGenerations(input.inputs, figures.generationTimeYears)
  notes.push(...timeNotes)
  if (times.events === 0) {
    return { parameters: null, problems: [`No release falls within the ${years(input.inputs.horizonYears)} horizon.`], notes }
  }
  const variant = input.inputs.variants[input.variantIndex ?? 0]
  if (!variant) notes.push('The scenario has no adaptive variant: the model follows the harmful-mutation load and neutral diversity only.')
  notes.push('Harmful mutations come from the model\'s default mutation load, burned in to each population\'s own size; the scenario\'s lethal-equivalent figure is not an input of this model.')
  const adaptive = variant ? { s: variant.s, h: variant.h, sourceFrequency: variant.sourceFrequency, recipientFrequency: 0 } : null
  return {
    parameters: {
      recipient,
      source,
      generations: times.generations,
      adaptive,
      translocation: {
        migrantsPerEvent: schedule.animalsPerEvent,
        eventInterval: times.eventInterval,
        events: times.events,
        firstEventGeneration: times.firstEventGeneration,
      },
    },
    problems: [],
    notes,
  }
}
