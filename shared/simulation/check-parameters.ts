/**
 * The engine's own domain checks of a simulation's parameters, before a run is queued: a dry
 * run with 0 replicates (`runEstablishmentReplicates` / `runRescueReplicates` validate every
 * input and expand the schedules, then simulate nothing), so the API refuses exactly what the
 * worker would refuse, in the engine's words.
 */
import { runEstablishmentReplicates, runRescueReplicates } from '../genetics/simulate'
import type { EstablishmentParams, RescueParams } from '../genetics/simulate'
import type { SimulationModel } from '../schemas/simulation-run'

/** A problem with one parameter: dotted `path` inside the request body, and the reason. */
export interface ParameterIssue { path: string, message: string }

/** `<function>: <parameter> must be <constraint>, got <value>` (shared/genetics/validate.ts). */
const ENGINE_MESSAGE = /^[A-Za-z]+: ([A-Za-z][\w.[\]]*) must be (.*)$/s

/**
 * The issue for an engine RangeError: the parameter as `parameters.<name>` (list entries such as
 * `census[]` point at the list) and the engine's sentence as the message.
 *
 * @param error - anything thrown by the engine
 * @returns the issue, or null when the error is not an engine domain error
 * @example engineParameterIssue(new RangeError('runRescueReplicates: translocation.events must be an integer ≥ 0, got -1'))
 *   // { path: 'parameters.translocation.events', message: 'translocation.events must be an integer ≥ 0, got -1.' }
 */
export function engineParameterIssue(error: unknown): ParameterIssue | null {
  if (!(error instanceof RangeError)) return null
  const match = ENGINE_MESSAGE.exec(error.message)
  if (!match) return null
  const [, parameter = '', rest = ''] = match
  const path = parameter.replace(/\[\]$/, '')
  return { path: `parameters.${path}`, message: `${parameter} must be ${rest}${/[.!?]$/.test(rest) ? '' : '.'}` }
}

/**
 * Runs the engine's checks on `parameters` for `model`.
 *
 * @param model - 'establishment' or 'rescue'
 * @param parameters - the parameters as they will be stored and run (shape already checked)
 * @returns null when the engine accepts them, else the first problem it finds
 * @throws whatever the engine throws that is not a domain error (a bug)
 * @example simulationParameterIssue('establishment', { census: 0, effectiveSize: 10, s: 0.1, h: 0.5, sourceFrequency: 0.5, migrantsPerEvent: 2, eventInterval: 1, events: 1, generations: 10 })
 *   // { path: 'parameters.census', message: 'census must be an integer ≥ 1, got 0.' }
 */
export function simulationParameterIssue(model: SimulationModel, parameters: unknown): ParameterIssue | null {
  const block = { seed: 0, firstReplicate: 0, replicates: 0 }
  try {
    if (model === 'establishment') runEstablishmentReplicates(parameters as EstablishmentParams, block)
    else runRescueReplicates(parameters as RescueParams, block)
    return null
  } catch (error) {
    const issue = engineParameterIssue(error)
    if (issue) return issue
    if (error instanceof RangeError) return { path: 'parameters', message: error.message }
    throw error
  }
}
