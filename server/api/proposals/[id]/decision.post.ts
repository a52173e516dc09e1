/**
 * POST /api/proposals/:id/decision { decision: 'approve' | 'return' | 'decline', comment, version? }
 *   → 200 ReviewStateDto
 *
 * A manager or administrator who did not write the proposal decides on it, always with a
 * comment. In one transaction: the decision row, the new status (approved proposals are frozen),
 * a version snapshot, the audit event, the e-mail to the author (queued, sent after commit and
 * retried on failure — a failing mail server never blocks or loses the decision) and, on
 * approval, the signed brief.
 *
 * Concurrency: the proposal row is locked (SELECT … FOR UPDATE); of two managers deciding at
 * once, the second waits, then finds the proposal decided and gets 409 — nothing of theirs is
 * written.
 *
 * 403 a viewer or biologist, the author (separation of duties), or not the assigned reviewer;
 * 404 another agency's proposal; 409 not submitted (e.g. already decided) or a stale
 * `version`; 422 no comment.
 */
import { DecisionSchema, type ReviewStateDto } from '#shared/schemas/review'
import { REVIEW_TRANSITIONS } from '#shared/review/workflow'
import { findAgencyProposal } from '../../../utils/proposal-access'
import { changedProposalFields, proposalDto } from '../../../utils/proposal-dto'
import { saveProposalVersion } from '../../../utils/proposal-versions'
import { requireReviewAction, requireReviewVersion } from '../../../utils/review-access'
import { issueBriefOnApproval } from '../../../utils/review-brief'
import { notifyDecision } from '../../../utils/notifications'
import { reviewState } from '../../../utils/review-state'

export default defineEventHandler(async (event): Promise<ReviewStateDto> => {
  const user = await requireRole(event, ...REVIEW_TRANSITIONS.approve.roles)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const input = await readBodyWith(event, DecisionSchema)
  const { sequelize, models } = await useDb()

  return sequelize.transaction(async (t) => {
    const proposal = await findAgencyProposal(user, id, { transaction: t, lock: true })
    const to = await requireReviewAction(input.decision, proposal, user, t)
    requireReviewVersion(proposal, input.version)
    if (to === null) throw createError({ status: 500, message: 'A decision must change the status.' })

    const before = proposalDto(proposal)
    const decision = await models.Decision.create({
      proposalId: proposal.id, decidedBy: user.id, decision: input.decision, comment: input.comment,
    }, { transaction: t })
    proposal.status = to
    proposal.decidedAt = new Date()
    await proposal.save({ transaction: t })
    const after = proposalDto(proposal)
    await saveProposalVersion(t, proposal, user, changedProposalFields(before, after))

    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: `proposal.${input.decision}`,
      entityType: 'proposal', entityId: proposal.id, before,
      after: { ...after, decision: { id: decision.id, decision: input.decision, comment: input.comment } },
    })
    await notifyDecision(t, { proposal, decision: input.decision, comment: input.comment, decider: user })
    if (input.decision === 'approve') await issueBriefOnApproval(t, proposal.id, user.id)
    return reviewState(proposal, user, t)
  })
})
