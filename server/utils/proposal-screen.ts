/**
 * The outbreeding screen of a proposal as its records give it: the bridge between the
 * subpopulation DTOs and shared/schemas/proposal.ts `prefillOutbreedingAnswers`.
 */
import { prefillOutbreedingAnswers, type OutbreedingAnswers, type ProposalSubpopulationDto } from '#shared/schemas/proposal'

/**
 * What the records say for a recipient and its sources.
 *
 * @param subpopulations - DTOs by id (loadProposalSubpopulations)
 * @param recipientId - the recipient
 * @param sourceIds - the wild sources (ids missing from the map are skipped)
 * @param captiveSource - the captive source text, or null
 */
export function proposalScreenFromRecords(subpopulations: Map<number, ProposalSubpopulationDto>, recipientId: number, sourceIds: readonly number[], captiveSource: string | null): OutbreedingAnswers {
  const record = (dto: ProposalSubpopulationDto) => ({
    name: dto.name, speciesId: dto.speciesId, speciesName: dto.speciesName || undefined, yearsIsolated: dto.yearsIsolated, environmentClass: dto.environmentClass,
  })
  const recipient = subpopulations.get(recipientId)
  const sources = sourceIds.map(id => subpopulations.get(id)).filter((dto): dto is ProposalSubpopulationDto => dto !== undefined)
  if (!recipient) return prefillOutbreedingAnswers({ name: 'Recipient', speciesId: 0, yearsIsolated: null, environmentClass: null }, [], false)
  return prefillOutbreedingAnswers(record(recipient), sources.map(record), captiveSource !== null)
}
