/**
 * DELETE /api/scenarios/:id[?version=N] → 200 { message }.
 *
 * Any scenario but the "No action" baseline (409). When it was the recommended one, the
 * recommendation is cleared (the database does it; the reason text is kept). 404 for another
 * agency's scenario; 409 when the proposal is not editable or a sent `version` is stale.
 * Biologists, managers and administrators; transactional with an audit event.
 */
import { ScenarioDeleteQuerySchema } from '#shared/schemas/scenario'
import type { ApiMessage } from '#shared/types/api'
import { PROPOSAL_WRITERS, requireEditableProposal } from '../../utils/proposal-access'
import { scenarioDto } from '../../utils/proposal-dto'
import { findAgencyScenario } from '../../utils/proposal-scenarios'

export default defineEventHandler(async (event): Promise<ApiMessage> => {
  const user = await requireRole(event, ...PROPOSAL_WRITERS)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const query = getQueryWith(event, ScenarioDeleteQuerySchema)
  const { sequelize } = await useDb()

  return sequelize.transaction(async (t) => {
    const { scenario, proposal } = await findAgencyScenario(user, id, { transaction: t, lock: true })
    requireEditableProposal(proposal)
    if (scenario.isBaseline) throw conflict('The "No action" baseline cannot be deleted: every proposal compares against it.')
    if (query.version !== undefined && query.version !== scenario.version) {
      throw conflict(`Someone else changed the scenario "${scenario.name}" since you loaded it (you had version ${query.version}, it is now ${scenario.version}). Reload and try again.`)
    }
    const before = scenarioDto(scenario)
    await scenario.destroy({ transaction: t })
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'scenario.delete',
      entityType: 'scenario', entityId: scenario.id, before, after: null,
    })
    return { message: `The scenario "${before.name}" was deleted.` }
  })
})
