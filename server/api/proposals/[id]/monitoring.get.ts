/**
 * GET /api/proposals/:id/monitoring → 200 MonitoringResponse
 *
 * After approval: the monitoring status, the moves recorded, the follow-up observations, the
 * recipient's census record since the first move, and observed against projected F, H and
 * census (planned releases, releases made, no action). Before approval the lists are empty and
 * the status says monitoring has not started. Every role of the agency; 404 for another
 * agency's proposal.
 */
import type { MonitoringResponse } from '#shared/schemas/review'
import { findAgencyProposal } from '../../../utils/proposal-access'
import { proposalMonitoring } from '../../../utils/review-monitoring'

export default defineEventHandler(async (event): Promise<MonitoringResponse> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const proposal = await findAgencyProposal(user, id)
  return proposalMonitoring(proposal, user)
})
