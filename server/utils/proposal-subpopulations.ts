/**
 * Subpopulations as a proposal needs them (ProposalSubpopulationDto): the record fields the
 * engine and the outbreeding screen read, the latest census and the working effective size
 * resolved the way the Atlas does it (shared/atlas/working-effective-size.ts). Always scoped
 * to one agency.
 */
import { Op, type Transaction } from 'sequelize'
import { latestFiguresOf } from '../atlas/subpopulation-dto'
import type { ProposalSubpopulationDto } from '#shared/schemas/proposal'
import { workingEffectiveSize } from '#shared/atlas/working-effective-size'
import type { InputIssue } from './validate'

/**
 * Loads the listed subpopulations of `agencyId` (ids of other agencies or unknown ids are
 * simply absent from the map).
 *
 * @param agencyId - the caller's agency
 * @param ids - subpopulation ids (duplicates allowed)
 * @param transaction - optional transaction to read in
 * @returns DTOs by id
 */
export async function loadProposalSubpopulations(agencyId: number, ids: readonly number[], transaction?: Transaction): Promise<Map<number, ProposalSubpopulationDto>> {
  const unique = [...new Set(ids)]
  const result = new Map<number, ProposalSubpopulationDto>()
  if (unique.length === 0) return result
  const { models, sequelize } = await useDb()
  const rows = await models.Subpopulation.findAll({
    where: { id: { [Op.in]: unique }, agencyId },
    include: [{ model: models.Species, as: 'species', attributes: ['id', 'commonName'] }],
    transaction,
  })
  const found = rows.map(row => row.id)
  if (found.length === 0) return result
  // The latest census and estimate of each, as the Atlas reads them (two queries for all).
  const figures = await latestFiguresOf(sequelize, found, transaction)

  for (const row of rows) {
    const latest = figures.get(row.id)
    const census = latest?.census ?? null
    const working = workingEffectiveSize({
      workingNe: row.workingNe ?? null,
      workingNeReason: row.workingNeReason ?? null,
      latestEstimate: latest?.estimate ?? null,
      latestCensus: census,
    })
    result.set(row.id, {
      id: row.id,
      name: row.name,
      speciesId: row.speciesId,
      speciesName: row.species?.commonName ?? '',
      environmentClass: row.environmentClass ?? null,
      yearsIsolated: row.yearsIsolated ?? null,
      generationTimeYears: row.generationTimeYears,
      latestCensus: census,
      workingNe: working.value,
      workingNeBasis: working.basis,
      workingNeNote: working.note,
      areaKm2: row.areaKm2 ?? null,
      centroid: row.centroidLon !== null && row.centroidLon !== undefined && row.centroidLat !== null && row.centroidLat !== undefined
        ? { lon: row.centroidLon, lat: row.centroidLat }
        : null,
      version: row.version,
    })
  }
  return result
}

/**
 * Checks a recipient and its sources against the agency's records: each must exist in the
 * agency, and the recipient may not be a source. Unknown ids and other agencies' ids get the
 * same message (nothing leaks).
 *
 * @returns the issues (empty when all is well), with paths of the request body
 */
export function proposalRecordIssues(found: Map<number, unknown>, recipientId: number | null, sourceIds: readonly number[]): InputIssue[] {
  const issues: InputIssue[] = []
  if (recipientId !== null && !found.has(recipientId)) {
    issues.push({ path: 'recipientId', message: `There is no subpopulation ${recipientId} in your agency's records.` })
  }
  sourceIds.forEach((id, index) => {
    if (id === recipientId) issues.push({ path: `sourceSubpopulationIds.${index}`, message: 'The recipient cannot also be a source.' })
    else if (!found.has(id)) issues.push({ path: `sourceSubpopulationIds.${index}`, message: `There is no subpopulation ${id} in your agency's records.` })
  })
  return issues
}
