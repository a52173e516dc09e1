/**
 * GET /api/subpopulations/:id → 200 SubpopulationDetailDto: the record (as in the list) with
 * its species and the number of proposals that name it. 404 for another agency's record.
 * Any signed-in role.
 */
import type { SubpopulationDetailDto } from '#shared/atlas/types'
import { ownSpecies, ownSubpopulation, referencesTo } from '../../atlas/records'
import { dtosOf } from '../../atlas/subpopulation-dto'

export default defineEventHandler(async (event): Promise<SubpopulationDetailDto> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const { sequelize, models } = await useDb()
  const row = await ownSubpopulation(models, user.agencyId, id)
  const species = await ownSpecies(models, user.agencyId, row.speciesId)
  const [dto] = await dtosOf(sequelize, [row])
  const references = await referencesTo(sequelize, row.id)
  if (!dto) throw notFound('Subpopulation')
  return {
    ...dto,
    species: { id: species.id, commonName: species.commonName, scientificName: species.scientificName, invented: Boolean(species.invented) },
    proposalCount: references.proposals.length,
  }
})
