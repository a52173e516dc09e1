/**
 * Scenario rules shared by the scenario routes:
 *   - a new proposal gets the "No action" baseline (schedule null) and a first scenario with
 *     the cited defaults (shared/schemas/scenario.ts);
 *   - a scenario is reached through its proposal, inside the caller's agency (404 otherwise);
 *   - the baseline cannot be deleted, and only its horizon can change;
 *   - a scenario's source must be one of the proposal's wild sources (or none).
 */
import type { Transaction } from 'sequelize'
import type { Proposal, Scenario } from '../db/models'
import {
  BASELINE_SCENARIO_NAME, FIRST_SCENARIO_NAME, baselineScenarioInputs, defaultScenarioInputs, type ScenarioInputs,
} from '#shared/schemas/scenario'
import type { InputIssue } from './validate'

/** Most scenarios one proposal may have (baseline included). */
export const MAXIMUM_SCENARIOS_PER_PROPOSAL = 20

/**
 * Creates the baseline and the first scenario of a new proposal.
 *
 * @param transaction - the transaction that creates the proposal
 * @param proposal - the new proposal
 * @returns [baseline, first scenario]
 */
export async function createStartingScenarios(transaction: Transaction, proposal: Proposal): Promise<[Scenario, Scenario]> {
  const { models } = await useDb()
  const baseline = await models.Scenario.create({
    proposalId: proposal.id, name: BASELINE_SCENARIO_NAME, isBaseline: true, inputs: baselineScenarioInputs() as unknown as Record<string, unknown>,
  }, { transaction })
  const first = await models.Scenario.create({
    proposalId: proposal.id, name: FIRST_SCENARIO_NAME, isBaseline: false,
    inputs: defaultScenarioInputs(proposal.sourceSubpopulationIds?.[0] ?? null) as unknown as Record<string, unknown>,
  }, { transaction })
  return [baseline, first]
}

/**
 * Scenario `id` with its proposal, if the proposal belongs to the caller's agency.
 *
 * @throws 404 "Scenario not found." otherwise
 */
export async function findAgencyScenario(user: { agencyId: number }, id: number, options: { transaction?: Transaction, lock?: boolean } = {}): Promise<{ scenario: Scenario, proposal: Proposal }> {
  const { models } = await useDb()
  const scenario = await models.Scenario.findOne({ where: { id }, transaction: options.transaction })
  if (!scenario) throw notFound('Scenario')
  const proposal = await models.Proposal.findOne({
    where: { id: scenario.proposalId, agencyId: user.agencyId },
    transaction: options.transaction,
    lock: options.lock && options.transaction ? options.transaction.LOCK.UPDATE : undefined,
  })
  if (!proposal) throw notFound('Scenario')
  if (options.lock && options.transaction) await scenario.reload({ transaction: options.transaction, lock: options.transaction.LOCK.UPDATE })
  return { scenario, proposal }
}

/** Issues with a scenario's source for this proposal (paths of the request body). */
export function scenarioSourceIssues(proposal: Proposal, inputs: ScenarioInputs, pathPrefix = 'inputs'): InputIssue[] {
  const source = inputs.sourceSubpopulationId
  if (source === null || (proposal.sourceSubpopulationIds ?? []).includes(source)) return []
  return [{ path: `${pathPrefix}.sourceSubpopulationId`, message: `Subpopulation ${source} is not one of this proposal's sources; add it to the proposal first.` }]
}

/**
 * True when `next` differs from `current` in anything but the horizon (the only input of the
 * baseline that may change).
 */
export function baselineChangeBeyondHorizon(current: ScenarioInputs, next: ScenarioInputs): boolean {
  return canonicalScenarioJson({ ...current, horizonYears: 0 }) !== canonicalScenarioJson({ ...next, horizonYears: 0 })
}

/**
 * JSON with object keys sorted at every level and undefined members left out, so that two
 * equal values always give the same text.
 *
 * @example canonicalScenarioJson({ b: 1, a: { d: [1, 2], c: undefined } }) // '{"a":{"d":[1,2]},"b":1}'
 */
export function canonicalScenarioJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalScenarioJson).join(',')}]`
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, member]) => member !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
    return `{${entries.map(([key, member]) => `${JSON.stringify(key)}:${canonicalScenarioJson(member)}`).join(',')}}`
  }
  return JSON.stringify(value) ?? 'null'
}
