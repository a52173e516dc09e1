/**
 * The engine's checks before a run is queued (shared/simulation/check-parameters.ts): valid
 * parameters pass, and every refusal comes back as an issue at `parameters.<name>` with the
 * engine's own sentence — including nested (rescue) and list (schedule) parameters.
 */
import { describe, expect, it } from 'vitest'
import { engineParameterIssue, simulationParameterIssue } from '../../../shared/simulation/check-parameters'

const establishment = { census: 60, effectiveSize: 20, s: 0.05, h: 0.5, sourceFrequency: 0.3, migrantsPerEvent: 4, eventInterval: 2, events: 3, generations: 200 }
const rescue = {
  recipient: { census: 60 }, source: { census: 150 }, generations: 20,
  translocation: { migrantsPerEvent: 4, eventInterval: 5, events: 2 },
}

describe('engineParameterIssue', () => {
  it('reads the parameter and the reason out of the engine\'s message', () => {
    expect(engineParameterIssue(new RangeError('runRescueReplicates: translocation.events must be an integer ≥ 0, got -1')))
      .toEqual({ path: 'parameters.translocation.events', message: 'translocation.events must be an integer ≥ 0, got -1.' })
    expect(engineParameterIssue(new RangeError('runEstablishmentReplicates: census[] must be an integer ≥ 1, got 2.5')))
      .toEqual({ path: 'parameters.census', message: 'census[] must be an integer ≥ 1, got 2.5.' })
  })

  it('null for other errors', () => {
    expect(engineParameterIssue(new TypeError('x: y must be z'))).toBeNull()
    expect(engineParameterIssue(new RangeError('Invalid array length'))).toBeNull()
    expect(engineParameterIssue('census must be 1')).toBeNull()
  })
})

describe('simulationParameterIssue', () => {
  it('accepts valid parameters of both models', () => {
    expect(simulationParameterIssue('establishment', establishment)).toBeNull()
    expect(simulationParameterIssue('establishment', { ...establishment, census: [60, 40, 20], effectiveSize: [20, 10] })).toBeNull()
    expect(simulationParameterIssue('rescue', rescue)).toBeNull()
  })

  it.each([
    ['establishment', { ...establishment, census: 0 }, 'parameters.census', 'census must be an integer ≥ 1, got 0.'],
    ['establishment', { ...establishment, effectiveSize: [20, -1] }, 'parameters.effectiveSize', 'effectiveSize[] must be a finite number > 0, got -1.'],
    ['establishment', { ...establishment, h: -30 }, 'parameters.h', 'h must be such that 1 + h·s > 0, got -30.'],
    ['establishment', { ...establishment, migrationRate: 2 }, 'parameters.migrationRate', 'migrationRate must be in [0, 1], got 2.'],
    ['establishment', { ...establishment, sourceFrequency: undefined }, 'parameters.sourceFrequency', 'sourceFrequency must be given unless introducedCopies is, got undefined.'],
    ['rescue', { ...rescue, generations: 20_000 }, 'parameters.generations', 'generations must be ≤ 10000, got 20000.'],
    ['rescue', { ...rescue, recipient: { census: 60, effectiveRatio: 1.5 } }, 'parameters.recipient.effectiveRatio', /recipient\.effectiveRatio must be in \[.*, 1\], got 1\.5\./],
    ['rescue', { ...rescue, load: { mutationRate: -1 } }, 'parameters.load.mutationRate', 'load.mutationRate must be in [0, 100], got -1.'],
  ] as const)('%s: refuses %j at the parameter', (model, parameters, path, message) => {
    const issue = simulationParameterIssue(model, parameters)
    expect(issue?.path).toBe(path)
    if (typeof message === 'string') expect(issue?.message).toBe(message)
    else expect(issue?.message).toMatch(message)
  })
})
