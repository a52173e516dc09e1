/**
 * POST /api/proposals/:id/scenarios { name, inputs } → 201 ScenarioDto.
 *
 * Adds an ordinary scenario (a schedule is required; only the automatic baseline has none).
 * Its source must be one of the proposal's wild sources or null (422). 404 another agency's
 * proposal; 409 when the proposal is not editable or already has the most scenarios allowed.
 * Biologists, managers and administrators; transactional with an audit event.
 */
import { ScenarioCreateSchema, type ScenarioDto } from '#shared/schemas/scenario'
import { findAgencyProposal, PROPOSAL_WRITERS, requireEditableProposal } from '../../../../utils/proposal-access'
import { scenarioDto } from '../../../../utils/proposal-dto'
import { MAXIMUM_SCENARIOS_PER_PROPOSAL, scenarioSourceIssues } from '../../../../utils/proposal-scenarios'

export default defineEventHandler(async (event): Promise<ScenarioDto> => {
  const user = await requireRole(event, ...PROPOSAL_WRITERS)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const input = await readBodyWith(event, ScenarioCreateSchema, { maxBytes: 64 * 1024 })
  const { sequelize, models } = await useDb()

  const created = await sequelize.transaction(async (t) => {
    const proposal = await findAgencyProposal(user, id, { transaction: t, lock: true })
    requireEditableProposal(proposal)
    const issues = scenarioSourceIssues(proposal, input.inputs)
    if (issues.length > 0) throw unprocessable(summariseIssues(issues), issues)
    const count = await models.Scenario.count({ where: { proposalId: proposal.id }, transaction: t })
    if (count >= MAXIMUM_SCENARIOS_PER_PROPOSAL) {
      throw conflict(`This proposal already has ${count} scenarios, the most allowed. Delete one before adding another.`)
    }
    const scenario = await models.Scenario.create({
      proposalId: proposal.id, name: input.name, isBaseline: false, inputs: input.inputs as unknown as Record<string, unknown>,
    }, { transaction: t })
    const after = scenarioDto(scenario)
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'scenario.create',
      entityType: 'scenario', entityId: scenario.id, before: null, after,
    })
    return after
  })
  setResponseStatus(event, 201)
  return created
})
