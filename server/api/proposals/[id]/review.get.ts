/**
 * GET /api/proposals/:id/review → 200 ReviewStateDto
 *
 * Where the proposal stands in review (status, author, reviewer, latest decision, revisions,
 * monitoring status) and which workflow actions the caller may take now. Every role of the
 * agency; 404 for another agency's proposal.
 */
import type { ReviewStateDto } from '#shared/schemas/review'
import { findAgencyProposal } from '../../../utils/proposal-access'
import { reviewState } from '../../../utils/review-state'

export default defineEventHandler(async (event): Promise<ReviewStateDto> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const proposal = await findAgencyProposal(user, id)
  return reviewState(proposal, user)
})
