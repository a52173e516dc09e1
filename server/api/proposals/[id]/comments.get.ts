/**
 * GET /api/proposals/:id/comments → 200 CommentListResponse (oldest first, mentions named).
 * Every role of the agency; 404 for another agency's proposal.
 */
import type { CommentListResponse } from '#shared/schemas/review'
import { findAgencyProposal } from '../../../utils/proposal-access'
import { proposalComments } from '../../../utils/review-comments'

export default defineEventHandler(async (event): Promise<CommentListResponse> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const proposal = await findAgencyProposal(user, id)
  return { items: await proposalComments(proposal) }
})
