/**
 * GET /api/proposals/:id → 200 ProposalDetailResponse: the proposal, recipient and sources with
 * their record figures, scenarios (baseline first), author, reviewer and last save.
 * Any signed-in role of the proposal's agency; another agency's proposal → 404. Remembered until
 * the records change (server/utils/read-cache.ts).
 */
import type { ProposalDetailResponse } from '#shared/schemas/proposal'
import { findAgencyProposal } from '../../utils/proposal-access'
import { proposalDetail } from '../../utils/proposal-detail'

/** What proposalDetail reads (server/utils/proposal-detail.ts and the helpers it calls). */
const PROPOSAL_DETAIL_TABLES = [
  'proposals', 'subpopulations', 'species', 'census_counts', 'effective_size_estimates', 'scenarios', 'users', 'proposal_versions',
] as const

export default defineEventHandler(async (event): Promise<ProposalDetailResponse> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  return rememberedRead(event, `proposal:${user.agencyId}:${id}`, PROPOSAL_DETAIL_TABLES, async () => proposalDetail(await findAgencyProposal(user, id)))
})
