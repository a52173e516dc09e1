/**
 * POST /api/proposals { title, recipientId, purpose?, sourceSubpopulationIds?, captiveSource? }
 *   → 201 ProposalDetailResponse.
 *
 * Creates a draft authored by the caller, with the outbreeding screen pre-filled from the
 * records, the "No action" baseline and a first scenario with cited defaults, version 0 in the
 * history and an audit event — all in one transaction. Recipient and sources must be the
 * agency's subpopulations (422 otherwise). Biologists, managers and administrators.
 */
import { ProposalCreateSchema, emptyNarrative, type ProposalDetailResponse } from '#shared/schemas/proposal'
import { PROPOSAL_WRITERS } from '../../utils/proposal-access'
import { proposalDetail } from '../../utils/proposal-detail'
import { proposalDto } from '../../utils/proposal-dto'
import { createStartingScenarios } from '../../utils/proposal-scenarios'
import { proposalScreenFromRecords } from '../../utils/proposal-screen'
import { loadProposalSubpopulations, proposalRecordIssues } from '../../utils/proposal-subpopulations'
import { saveProposalVersion } from '../../utils/proposal-versions'

export default defineEventHandler(async (event): Promise<ProposalDetailResponse> => {
  const user = await requireRole(event, ...PROPOSAL_WRITERS)
  const input = await readBodyWith(event, ProposalCreateSchema, { maxBytes: 64 * 1024 })
  const { sequelize, models } = await useDb()

  const detail = await sequelize.transaction(async (t) => {
    const records = await loadProposalSubpopulations(user.agencyId, [input.recipientId, ...input.sourceSubpopulationIds], t)
    const issues = proposalRecordIssues(records, input.recipientId, input.sourceSubpopulationIds)
    if (issues.length > 0) throw unprocessable(summariseIssues(issues), issues)
    const captiveSource = input.captiveSource ?? null

    const proposal = await models.Proposal.create({
      agencyId: user.agencyId,
      recipientId: input.recipientId,
      title: input.title,
      purpose: input.purpose,
      authorId: user.id,
      sourceSubpopulationIds: input.sourceSubpopulationIds,
      captiveSource,
      narrative: emptyNarrative(),
      outbreedingAnswers: proposalScreenFromRecords(records, input.recipientId, input.sourceSubpopulationIds, captiveSource),
      checklist: {},
    }, { transaction: t })
    const scenarios = await createStartingScenarios(t, proposal)
    await saveProposalVersion(t, proposal, user, [])
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'proposal.create',
      entityType: 'proposal', entityId: proposal.id, before: null,
      after: { ...proposalDto(proposal), scenarioIds: scenarios.map(scenario => scenario.id) },
    })
    return proposalDetail(proposal, t)
  })
  setResponseStatus(event, 201)
  return detail
})
