/**
 * POST /api/proposals/:id/withdraw { reason?, version? } → 200 ReviewStateDto
 *
 * The author takes a submitted (or returned) proposal out of review; it is closed afterwards
 * (a revision can start from it). Version snapshot and audit event in one transaction.
 *
 * 403 not the author; 404 another agency's proposal; 409 not submitted or returned, or a stale
 * `version`; 422 bad input.
 */
import { WithdrawSchema, type ReviewStateDto } from '#shared/schemas/review'
import { REVIEW_TRANSITIONS } from '#shared/review/workflow'
import { findAgencyProposal } from '../../../utils/proposal-access'
import { changedProposalFields, proposalDto } from '../../../utils/proposal-dto'
import { saveProposalVersion } from '../../../utils/proposal-versions'
import { requireReviewAction, requireReviewVersion } from '../../../utils/review-access'
import { reviewState } from '../../../utils/review-state'

export default defineEventHandler(async (event): Promise<ReviewStateDto> => {
  const user = await requireRole(event, ...REVIEW_TRANSITIONS.withdraw.roles)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const input = await readBodyWith(event, WithdrawSchema)
  const { sequelize } = await useDb()

  return sequelize.transaction(async (t) => {
    const proposal = await findAgencyProposal(user, id, { transaction: t, lock: true })
    await requireReviewAction('withdraw', proposal, user, t)
    requireReviewVersion(proposal, input.version)

    const before = proposalDto(proposal)
    proposal.status = 'withdrawn'
    await proposal.save({ transaction: t })
    const after = proposalDto(proposal)
    await saveProposalVersion(t, proposal, user, changedProposalFields(before, after))
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'proposal.withdraw',
      entityType: 'proposal', entityId: proposal.id, before, after: { ...after, reason: input.reason ?? '' },
    })
    return reviewState(proposal, user, t)
  })
})
