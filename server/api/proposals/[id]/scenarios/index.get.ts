/**
 * GET /api/proposals/:id/scenarios → 200 { items: ScenarioDto[] } (baseline first, then in
 * creation order). Any signed-in role of the proposal's agency; another agency's → 404.
 */
import type { ScenarioListResponse } from '#shared/schemas/scenario'
import { findAgencyProposal } from '../../../../utils/proposal-access'
import { scenarioDto } from '../../../../utils/proposal-dto'

export default defineEventHandler(async (event): Promise<ScenarioListResponse> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const proposal = await findAgencyProposal(user, id)
  const { models } = await useDb()
  const rows = await models.Scenario.findAll({ where: { proposalId: proposal.id }, order: [['isBaseline', 'DESC'], ['id', 'ASC']] })
  return { items: rows.map(scenarioDto) }
})
