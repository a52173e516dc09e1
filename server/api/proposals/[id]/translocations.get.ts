/**
 * GET /api/proposals/:id/translocations → 200 TranslocationListResponse — the moves recorded
 * under the proposal, by day. Every role of the agency; 404 for another agency's proposal.
 */
import type { TranslocationListResponse } from '#shared/schemas/review'
import { findAgencyProposal } from '../../../utils/proposal-access'
import { proposalTranslocations } from '../../../utils/review-monitoring'

export default defineEventHandler(async (event): Promise<TranslocationListResponse> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const proposal = await findAgencyProposal(user, id)
  return { items: await proposalTranslocations(proposal) }
})
