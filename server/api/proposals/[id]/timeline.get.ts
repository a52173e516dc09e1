/**
 * GET /api/proposals/:id/timeline → 200 TimelineResponse — submissions, reviewer changes,
 * decisions, withdrawals, revisions, comments, translocations and follow-ups, with who and
 * when, oldest first; and the people of the agency who can be mentioned. Every role of the
 * agency; 404 for another agency's proposal.
 */
import type { TimelineResponse } from '#shared/schemas/review'
import { findAgencyProposal } from '../../../utils/proposal-access'
import { mentionablePeople } from '../../../utils/review-comments'
import { proposalTimeline } from '../../../utils/review-timeline'

export default defineEventHandler(async (event): Promise<TimelineResponse> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const proposal = await findAgencyProposal(user, id)
  const [items, people] = await Promise.all([proposalTimeline(proposal), mentionablePeople(user.agencyId)])
  return { items, people }
})
