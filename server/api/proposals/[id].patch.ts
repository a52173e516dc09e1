/**
 * PATCH /api/proposals/:id { …any of title, purpose, sourceSubpopulationIds, captiveSource,
 *   narrative, outbreedingAnswers, checklist, recommendedScenarioId; version } → 200
 *   ProposalDetailResponse.
 *
 * Autosave target. narrative / outbreedingAnswers / checklist merge key by key into what is
 * stored; a change of sources (or captive source) re-derives the screen answers that followed
 * the records (shared/schemas/proposal.ts mergeOutbreedingAnswers). Each save that changes
 * something bumps `version`, stores a snapshot in proposal_versions and an audit event, in one
 * transaction; a save that changes nothing returns the proposal as it is.
 *
 * 404 another agency's proposal; 409 not editable (submitted, approved — frozen —, declined,
 * withdrawn) or stale `version` (naming who saved last and when); 422 bad input, sources
 * outside the agency, a recommended scenario of another proposal, or an answer of the screen
 * that overrides the records without a reason. Biologists, managers and administrators.
 */
import { ProposalPatchSchema, mergeOutbreedingAnswers, type Checklist, type ProposalDetailResponse } from '#shared/schemas/proposal'
import { findAgencyProposal, PROPOSAL_WRITERS, requireCurrentProposalVersion, requireEditableProposal } from '../../utils/proposal-access'
import { proposalDetail } from '../../utils/proposal-detail'
import { changedProposalFields, proposalChecklistOf, proposalDto, proposalNarrativeOf } from '../../utils/proposal-dto'
import { proposalScreenFromRecords } from '../../utils/proposal-screen'
import { loadProposalSubpopulations, proposalRecordIssues } from '../../utils/proposal-subpopulations'
import { saveProposalVersion } from '../../utils/proposal-versions'
import type { InputIssue } from '../../utils/validate'

export default defineEventHandler(async (event): Promise<ProposalDetailResponse> => {
  const user = await requireRole(event, ...PROPOSAL_WRITERS)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const input = await readBodyWith(event, ProposalPatchSchema, { maxBytes: 256 * 1024 })
  const { sequelize, models } = await useDb()

  return sequelize.transaction(async (t) => {
    const proposal = await findAgencyProposal(user, id, { transaction: t, lock: true })
    requireEditableProposal(proposal)
    await requireCurrentProposalVersion(proposal, input.version, user, t)
    const before = proposalDto(proposal)
    const issues: InputIssue[] = []

    const oldSources = before.sourceSubpopulationIds
    const newSources = input.sourceSubpopulationIds ?? oldSources
    const oldCaptive = before.captiveSource
    const newCaptive = input.captiveSource !== undefined ? input.captiveSource : oldCaptive
    const records = await loadProposalSubpopulations(user.agencyId, [proposal.recipientId, ...oldSources, ...newSources], t)
    if (input.sourceSubpopulationIds) issues.push(...proposalRecordIssues(records, proposal.recipientId, newSources).filter(issue => issue.path !== 'recipientId'))

    if (input.recommendedScenarioId !== undefined && input.recommendedScenarioId !== null) {
      const scenario = await models.Scenario.findOne({ where: { id: input.recommendedScenarioId, proposalId: proposal.id }, transaction: t })
      if (!scenario) issues.push({ path: 'recommendedScenarioId', message: 'Choose one of this proposal\'s scenarios.' })
    }

    const recordsChanged = input.sourceSubpopulationIds !== undefined || input.captiveSource !== undefined
    let outbreedingAnswers = before.outbreedingAnswers
    if (recordsChanged || input.outbreedingAnswers) {
      const previous = proposalScreenFromRecords(records, proposal.recipientId, oldSources, oldCaptive)
      const current = proposalScreenFromRecords(records, proposal.recipientId, newSources, newCaptive)
      const merged = mergeOutbreedingAnswers(before.outbreedingAnswers, previous, current, input.outbreedingAnswers ?? {})
      issues.push(...merged.issues)
      outbreedingAnswers = merged.answers
    }
    if (issues.length > 0) throw unprocessable(summariseIssues(issues), issues)

    if (input.title !== undefined) proposal.title = input.title
    if (input.purpose !== undefined) proposal.purpose = input.purpose
    if (input.sourceSubpopulationIds !== undefined) proposal.sourceSubpopulationIds = newSources
    if (input.captiveSource !== undefined) proposal.captiveSource = newCaptive
    if (input.recommendedScenarioId !== undefined) proposal.recommendedScenarioId = input.recommendedScenarioId
    if (input.narrative) proposal.narrative = { ...proposalNarrativeOf(proposal.narrative), ...input.narrative }
    if (recordsChanged || input.outbreedingAnswers) proposal.outbreedingAnswers = { ...outbreedingAnswers }
    if (input.checklist) {
      const checklist: Checklist = { ...proposalChecklistOf(proposal.checklist), ...input.checklist }
      proposal.checklist = proposalChecklistOf(checklist)
    }

    const changed = changedProposalFields(before, proposalDto(proposal))
    if (changed.length === 0) return proposalDetail(proposal, t)
    for (const field of ['narrative', 'outbreedingAnswers', 'checklist', 'sourceSubpopulationIds'] as const) {
      if (changed.includes(field)) proposal.changed(field, true)
    }
    await proposal.save({ transaction: t })
    await saveProposalVersion(t, proposal, user, changed)
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'proposal.update',
      entityType: 'proposal', entityId: proposal.id, before, after: proposalDto(proposal),
    })
    return proposalDetail(proposal, t)
  })
})
