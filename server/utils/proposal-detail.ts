/**
 * The full answer of GET /api/proposals/:id (and of POST / PATCH): the proposal, its recipient
 * and sources with the record figures the engine needs, its scenarios (baseline first), the
 * author, the reviewer and the last save — enough for the browser to compute live results
 * without further requests.
 */
import type { Transaction } from 'sequelize'
import type { Proposal } from '../db/models'
import type { ProposalDetailResponse, ProposalPersonDto, ProposalSubpopulationDto } from '#shared/schemas/proposal'
import { proposalDto, scenarioDto } from './proposal-dto'
import { loadProposalSubpopulations } from './proposal-subpopulations'
import { latestProposalVersion, proposalVersionSummaryDto } from './proposal-versions'

/** A subpopulation that is referenced but not readable (should not happen: FK + agency). */
function missingSubpopulation(id: number): ProposalSubpopulationDto {
  return {
    id, name: `Subpopulation ${id} (not found)`, speciesId: 0, speciesName: '', environmentClass: null, yearsIsolated: null,
    generationTimeYears: 1, latestCensus: null, workingNe: null, workingNeBasis: 'none', workingNeNote: 'The record could not be read.',
    areaKm2: null, centroid: null, version: 0,
  }
}

/**
 * Builds the detail response of a proposal.
 *
 * @param proposal - a proposal of the caller's agency (already scope-checked)
 * @param transaction - read inside this transaction (to return what a write just stored)
 */
export async function proposalDetail(proposal: Proposal, transaction?: Transaction): Promise<ProposalDetailResponse> {
  const { models } = await useDb()
  const sourceIds = proposal.sourceSubpopulationIds ?? []
  const subpopulations = await loadProposalSubpopulations(proposal.agencyId, [proposal.recipientId, ...sourceIds], transaction)
  const scenarios = await models.Scenario.findAll({
    where: { proposalId: proposal.id },
    order: [['isBaseline', 'DESC'], ['id', 'ASC']],
    transaction,
  })
  const peopleIds = [proposal.authorId, proposal.reviewerId].filter((id): id is number => typeof id === 'number')
  const people = await models.User.findAll({ where: { id: peopleIds, agencyId: proposal.agencyId }, attributes: ['id', 'name'], transaction })
  const person = (id: number | null | undefined): ProposalPersonDto | null => {
    if (id === null || id === undefined) return null
    const row = people.find(candidate => candidate.id === id)
    return { id, name: row?.name ?? 'Former user' }
  }
  const latest = await latestProposalVersion(proposal.id, transaction)
  const lastSaved = latest ? proposalVersionSummaryDto(latest) : null

  return {
    proposal: proposalDto(proposal),
    recipient: subpopulations.get(proposal.recipientId) ?? missingSubpopulation(proposal.recipientId),
    sources: sourceIds.map(id => subpopulations.get(id) ?? missingSubpopulation(id)),
    scenarios: scenarios.map(scenarioDto),
    author: person(proposal.authorId) ?? { id: proposal.authorId, name: 'Former user' },
    reviewer: person(proposal.reviewerId),
    lastSaved: lastSaved ? { version: lastSaved.version, savedBy: lastSaved.savedBy, savedAt: lastSaved.savedAt } : null,
  }
}
