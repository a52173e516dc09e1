/**
 * POST /api/proposals/:id/revise { title? } → 201 ReviseResponse
 *
 * Starts a new draft linked to a closed proposal (approved — frozen —, declined or withdrawn):
 * it copies the fields and every scenario, sets `revises_id`, and is authored by the caller.
 * Version 0 of the new draft, an audit event on each of the two proposals, one transaction.
 *
 * 403 viewers; 404 another agency's proposal; 409 the proposal is still open (edit it
 * directly) or a revision of it is already open; 422 bad input.
 */
import { ReviseSchema, type ReviseResponse } from '#shared/schemas/review'
import { REVIEW_TRANSITIONS } from '#shared/review/workflow'
import { findAgencyProposal } from '../../../utils/proposal-access'
import { proposalDto } from '../../../utils/proposal-dto'
import { saveProposalVersion } from '../../../utils/proposal-versions'
import { requireReviewAction } from '../../../utils/review-access'
import { createRevision, requireNoOpenRevision } from '../../../utils/review-revise'
import { reviewState } from '../../../utils/review-state'

export default defineEventHandler(async (event): Promise<ReviseResponse> => {
  const user = await requireRole(event, ...REVIEW_TRANSITIONS.revise.roles)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const input = await readBodyWith(event, ReviseSchema)
  const { sequelize } = await useDb()

  const result = await sequelize.transaction(async (t) => {
    const original = await findAgencyProposal(user, id, { transaction: t, lock: true })
    await requireReviewAction('revise', original, user, t)
    await requireNoOpenRevision(original, t)

    const { revision, scenarioIds } = await createRevision(t, original, user, input.title)
    await saveProposalVersion(t, revision, user, [])
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'proposal.create',
      entityType: 'proposal', entityId: revision.id, before: null,
      after: { ...proposalDto(revision), scenarioIds },
    })
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'proposal.revise',
      entityType: 'proposal', entityId: original.id, before: null,
      after: { revisionId: revision.id, revisionTitle: revision.title, status: original.status },
    })
    return { proposalId: revision.id, review: await reviewState(revision, user, t) }
  })
  setResponseStatus(event, 201)
  return result
})
