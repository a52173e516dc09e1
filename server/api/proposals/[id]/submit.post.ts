/**
 * POST /api/proposals/:id/submit { version?, reviewerId? } → 200 ReviewStateDto
 *
 * The author sends a draft (or a returned proposal, after changes) for a decision. Optionally
 * names the reviewer (an active manager or administrator of the agency, not the author).
 * Queues "review requested" to the agency's managers other than the author, and to the
 * reviewer; writes a version snapshot and an audit event — all in one transaction.
 *
 * 403 not the author / a viewer; 404 another agency's proposal; 409 not a draft or returned,
 * or a stale `version`; 422 bad input or a reviewer who cannot review.
 */
import { ProposalSubmitSchema, type ReviewStateDto } from '#shared/schemas/review'
import { REVIEW_TRANSITIONS } from '#shared/review/workflow'
import { findAgencyProposal } from '../../../utils/proposal-access'
import { changedProposalFields, proposalDto } from '../../../utils/proposal-dto'
import { saveProposalVersion } from '../../../utils/proposal-versions'
import { requireReviewAction, requireReviewVersion } from '../../../utils/review-access'
import { notifySubmitted } from '../../../utils/notifications'
import { requireReviewerCandidate } from '../../../utils/review-reviewer'
import { reviewState } from '../../../utils/review-state'

export default defineEventHandler(async (event): Promise<ReviewStateDto> => {
  const user = await requireRole(event, ...REVIEW_TRANSITIONS.submit.roles)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const input = await readBodyWith(event, ProposalSubmitSchema)
  const { sequelize, models } = await useDb()

  return sequelize.transaction(async (t) => {
    const proposal = await findAgencyProposal(user, id, { transaction: t, lock: true })
    await requireReviewAction('submit', proposal, user, t)
    requireReviewVersion(proposal, input.version)
    if (input.reviewerId) await requireReviewerCandidate(proposal, input.reviewerId, t)

    const before = proposalDto(proposal)
    const resubmitted = proposal.status === 'returned'
    proposal.status = 'submitted'
    proposal.submittedAt = new Date()
    proposal.decidedAt = null
    if (input.reviewerId !== undefined) proposal.reviewerId = input.reviewerId
    await proposal.save({ transaction: t })
    const after = proposalDto(proposal)
    await saveProposalVersion(t, proposal, user, changedProposalFields(before, after))

    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'proposal.submit',
      entityType: 'proposal', entityId: proposal.id, before, after: { ...after, resubmitted },
    })
    const recipient = await models.Subpopulation.findByPk(proposal.recipientId, { attributes: ['id', 'name'], transaction: t })
    await notifySubmitted(t, { proposal, author: user, recipientName: recipient?.name ?? 'unknown', resubmitted })
    return reviewState(proposal, user, t)
  })
})
