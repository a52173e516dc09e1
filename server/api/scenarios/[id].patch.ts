/**
 * PATCH /api/scenarios/:id { name?, inputs?, version } → 200 ScenarioDto.
 *
 * `inputs` replaces the stored inputs as a whole. The "No action" baseline keeps its name and
 * every input but the horizon (409 otherwise); an ordinary scenario needs a schedule (422) and
 * a source among the proposal's wild sources or none (422). 404 for another agency's scenario;
 * 409 when the proposal is not editable or `version` is stale. Biologists, managers and
 * administrators; transactional with an audit event.
 */
import { ScenarioPatchSchema, type ScenarioDto, type ScenarioInputs } from '#shared/schemas/scenario'
import { PROPOSAL_WRITERS, requireEditableProposal } from '../../utils/proposal-access'
import { scenarioDto } from '../../utils/proposal-dto'
import { baselineChangeBeyondHorizon, findAgencyScenario, scenarioSourceIssues } from '../../utils/proposal-scenarios'

export default defineEventHandler(async (event): Promise<ScenarioDto> => {
  const user = await requireRole(event, ...PROPOSAL_WRITERS)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const input = await readBodyWith(event, ScenarioPatchSchema, { maxBytes: 64 * 1024 })
  const { sequelize } = await useDb()

  return sequelize.transaction(async (t) => {
    const { scenario, proposal } = await findAgencyScenario(user, id, { transaction: t, lock: true })
    requireEditableProposal(proposal)
    if (scenario.version !== input.version) {
      throw conflict(`Someone else changed the scenario "${scenario.name}" since you loaded it (you had version ${input.version}, it is now ${scenario.version}). Reload to see their changes; your edits are still in the form.`)
    }
    const before = scenarioDto(scenario)
    if (scenario.isBaseline) {
      if (input.name !== undefined && input.name !== scenario.name) {
        throw conflict('The "No action" baseline keeps its name; only its horizon can change.')
      }
      if (input.inputs && baselineChangeBeyondHorizon(before.inputs, input.inputs)) {
        throw conflict('The "No action" baseline moves no animals; only its horizon can change.')
      }
    } else if (input.inputs) {
      const issues = input.inputs.schedule === null
        ? [{ path: 'inputs.schedule', message: 'Give a release schedule; only the "No action" baseline has none.' }]
        : scenarioSourceIssues(proposal, input.inputs)
      if (issues.length > 0) throw unprocessable(summariseIssues(issues), issues)
    }

    if (input.name !== undefined) scenario.name = input.name
    if (input.inputs) {
      const next: ScenarioInputs = scenario.isBaseline ? { ...before.inputs, horizonYears: input.inputs.horizonYears } : input.inputs
      scenario.inputs = next as unknown as Record<string, unknown>
      scenario.changed('inputs', true)
    }
    if (JSON.stringify(scenarioDto(scenario)) === JSON.stringify(before)) return before
    await scenario.save({ transaction: t })
    const after = scenarioDto(scenario)
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'scenario.update',
      entityType: 'scenario', entityId: scenario.id, before, after,
    })
    return after
  })
})
