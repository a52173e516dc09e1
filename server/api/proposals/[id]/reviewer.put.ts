/**
 * PUT /api/proposals/:id/reviewer { reviewerId: number | null } → 200 ReviewStateDto
 *
 * Administrators assign (or clear, with null) the reviewer of an open proposal (draft, submitted
 * or returned). While a reviewer is assigned, only they or an administrator decide. The new
 * reviewer gets an e-mail; version snapshot and audit event in the same transaction. Assigning
 * the reviewer already assigned changes nothing.
 *
 * 403 not an administrator; 404 another agency's proposal; 409 a closed proposal; 422 someone
 * who cannot review (not a manager or administrator of the agency, inactive, or the author).
 */
import { ReviewerAssignSchema, type ReviewStateDto } from '#shared/schemas/review'
import { REVIEW_TRANSITIONS } from '#shared/review/workflow'
import { findAgencyProposal } from '../../../utils/proposal-access'
import { changedProposalFields, proposalDto } from '../../../utils/proposal-dto'
import { saveProposalVersion } from '../../../utils/proposal-versions'
import { notifyReviewerAssigned } from '../../../utils/notifications'
import { requireReviewAction } from '../../../utils/review-access'
import { requireReviewerCandidate } from '../../../utils/review-reviewer'
import { reviewState } from '../../../utils/review-state'

export default defineEventHandler(async (event): Promise<ReviewStateDto> => {
  const user = await requireRole(event, ...REVIEW_TRANSITIONS.reassign.roles)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const input = await readBodyWith(event, ReviewerAssignSchema)
  const { sequelize } = await useDb()

  return sequelize.transaction(async (t) => {
    const proposal = await findAgencyProposal(user, id, { transaction: t, lock: true })
    await requireReviewAction('reassign', proposal, user, t)
    const reviewer = input.reviewerId === null ? null : await requireReviewerCandidate(proposal, input.reviewerId, t)
    if ((proposal.reviewerId ?? null) === input.reviewerId) return reviewState(proposal, user, t)

    const before = proposalDto(proposal)
    proposal.reviewerId = input.reviewerId
    await proposal.save({ transaction: t })
    const after = proposalDto(proposal)
    await saveProposalVersion(t, proposal, user, changedProposalFields(before, after))
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'proposal.reviewer',
      entityType: 'proposal', entityId: proposal.id,
      before: { reviewerId: before.reviewerId, status: before.status },
      after: { reviewerId: after.reviewerId, reviewerName: reviewer?.name ?? null, status: after.status },
    })
    if (reviewer) await notifyReviewerAssigned(t, { proposal, reviewer, assignedBy: user })
    return reviewState(proposal, user, t)
  })
})
