/**
 * GET /api/proposals/:id/versions/:version → 200 ProposalVersionDto — the proposal as it was
 * after that save (`snapshot`), with who saved it, when and what changed. 404 for another
 * agency's proposal or a version that was never saved.
 */
import { ProposalVersionParamsSchema, type ProposalVersionDto } from '#shared/schemas/proposal'
import { findAgencyProposal } from '../../../../utils/proposal-access'
import { proposalVersionDto } from '../../../../utils/proposal-versions'

export default defineEventHandler(async (event): Promise<ProposalVersionDto> => {
  const user = await requireUser(event)
  const { id, version } = getParamsWith(event, ProposalVersionParamsSchema)
  const proposal = await findAgencyProposal(user, id)
  const { models } = await useDb()
  const row = await models.ProposalVersion.findOne({
    where: { proposalId: proposal.id, version },
    include: [{ model: models.User, as: 'saver', attributes: ['id', 'name'] }],
  })
  if (!row) throw notFound(`Version ${version} of this proposal`)
  return proposalVersionDto(row)
})
