/**
 * DELETE /api/proposals/:id[?version=N] → 200 { message }.
 *
 * Only drafts, and only by their author or an administrator (403 for anyone else; viewers are
 * refused by role). Scenarios and version history go with it (ON DELETE CASCADE); an audit
 * event keeps the deleted proposal. 404 another agency's proposal; 409 not a draft, or a stale
 * `version` when one is sent.
 */
import { ProposalDeleteQuerySchema } from '#shared/schemas/proposal'
import type { ApiMessage } from '#shared/types/api'
import { findAgencyProposal, PROPOSAL_WRITERS, requireCurrentProposalVersion } from '../../utils/proposal-access'
import { proposalDto, scenarioDto } from '../../utils/proposal-dto'

export default defineEventHandler(async (event): Promise<ApiMessage> => {
  const user = await requireRole(event, ...PROPOSAL_WRITERS)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const query = getQueryWith(event, ProposalDeleteQuerySchema)
  const { sequelize, models } = await useDb()

  return sequelize.transaction(async (t) => {
    const proposal = await findAgencyProposal(user, id, { transaction: t, lock: true })
    if (proposal.status !== 'draft') {
      throw conflict(`Only drafts can be deleted; this proposal is ${proposal.status}. Withdraw it instead, or keep it for the record.`)
    }
    if (proposal.authorId !== user.id && user.role !== 'administrator') {
      throw forbidden('Only the author of this draft or an administrator can delete it.')
    }
    if (query.version !== undefined) await requireCurrentProposalVersion(proposal, query.version, user, t)
    const scenarios = await models.Scenario.findAll({ where: { proposalId: proposal.id }, order: [['id', 'ASC']], transaction: t })
    const before = { ...proposalDto(proposal), scenarios: scenarios.map(scenarioDto) }
    await proposal.destroy({ transaction: t })
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'proposal.delete',
      entityType: 'proposal', entityId: proposal.id, before, after: null,
    })
    return { message: `The draft "${proposal.title}" was deleted.` }
  })
})
