/**
 * Finding the agency's own species and subpopulations, and what else refers to a
 * subpopulation. A record of another agency is "not found" (404), never "forbidden".
 */
import { Op, QueryTypes, col, fn, where, type Sequelize, type Transaction } from 'sequelize'
import type { Models, Species, Subpopulation } from '../db/models'
import { conflict, notFound } from '../utils/http-errors'

/** Roles that may change subpopulations (viewers read only). */
export const ATLAS_WRITERS = ['biologist', 'manager', 'administrator'] as const

/** The species `id` of the agency, or a 404. */
export async function ownSpecies(models: Models, agencyId: number, id: number, transaction?: Transaction): Promise<Species> {
  const species = await models.Species.findOne({ where: { id, agencyId }, transaction })
  if (!species) throw notFound('Species')
  return species
}

/** The subpopulation `id` of the agency (locked FOR UPDATE inside a transaction), or a 404. */
export async function ownSubpopulation(models: Models, agencyId: number, id: number, transaction?: Transaction): Promise<Subpopulation> {
  const row = await models.Subpopulation.findOne({
    where: { id, agencyId },
    transaction,
    lock: transaction ? transaction.LOCK.UPDATE : undefined,
  })
  if (!row) throw notFound('Subpopulation')
  return row
}

/** What refers to a subpopulation and would stop its deletion. */
export interface SubpopulationReferences {
  /** Proposals naming it as recipient or as a source (any state). */
  proposals: { id: number, title: string }[]
  attachments: number
  geneticDatasets: number
}

/** Counts the proposals, attachments and genotype files that refer to subpopulation `id`. */
export async function referencesTo(sequelize: Sequelize, id: number, transaction?: Transaction): Promise<SubpopulationReferences> {
  const proposals = await sequelize.query<{ id: number, title: string }>(
    `SELECT id, title FROM proposals WHERE recipient_id = :id OR :id = ANY (source_subpopulation_ids) ORDER BY id`,
    { replacements: { id }, type: QueryTypes.SELECT, transaction },
  )
  const [counts] = await sequelize.query<{ attachments: string, genetic_datasets: string }>(
    `SELECT (SELECT count(*) FROM attachments WHERE owner_type = 'subpopulation' AND owner_id = :id) AS attachments,
            (SELECT count(*) FROM genetic_datasets WHERE subpopulation_id = :id) AS genetic_datasets`,
    { replacements: { id }, type: QueryTypes.SELECT, transaction },
  )
  return {
    proposals: proposals.map(row => ({ id: Number(row.id), title: row.title })),
    attachments: Number(counts?.attachments ?? 0),
    geneticDatasets: Number(counts?.genetic_datasets ?? 0),
  }
}

/** Number of subpopulations of each species of the agency. */
export async function subpopulationCounts(sequelize: Sequelize, agencyId: number): Promise<Map<number, number>> {
  const rows = await sequelize.query<{ species_id: number, count: string }>(
    'SELECT species_id, count(*) AS count FROM subpopulations WHERE agency_id = :agencyId GROUP BY species_id',
    { replacements: { agencyId }, type: QueryTypes.SELECT },
  )
  return new Map(rows.map(row => [Number(row.species_id), Number(row.count)]))
}

/** A 409 when another subpopulation of the species already has this name (case ignored). */
export async function requireFreeName(models: Models, speciesId: number, name: string, exceptId: number | null, transaction?: Transaction): Promise<void> {
  const clash = await models.Subpopulation.findOne({
    where: {
      speciesId,
      ...(exceptId === null ? {} : { id: { [Op.ne]: exceptId } }),
      [Op.and]: [where(fn('lower', col('name')), name.toLowerCase())],
    },
    transaction,
  })
  if (clash) throw conflict(`A subpopulation named "${clash.name}" already exists for this species. Choose another name.`)
}
