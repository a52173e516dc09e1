/**
 * GET /api/proposals/:id/versions → 200 { items: ProposalVersionSummaryDto[] } — the saved
 * versions, newest first: version, who saved, when, which fields changed. Any signed-in role of
 * the proposal's agency; another agency's → 404.
 */
import type { ProposalVersionListResponse } from '#shared/schemas/proposal'
import { findAgencyProposal } from '../../../../utils/proposal-access'
import { proposalVersionSummaryDto } from '../../../../utils/proposal-versions'

export default defineEventHandler(async (event): Promise<ProposalVersionListResponse> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const proposal = await findAgencyProposal(user, id)
  const { models } = await useDb()
  const rows = await models.ProposalVersion.findAll({
    where: { proposalId: proposal.id },
    include: [{ model: models.User, as: 'saver', attributes: ['id', 'name'] }],
    order: [['version', 'DESC'], ['id', 'DESC']],
  })
  return { items: rows.map(proposalVersionSummaryDto) }
})
