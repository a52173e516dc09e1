/**
 * GET /api/species/:id → 200 SpeciesDto; 404 for a species of another agency. Any signed-in role.
 */
import type { SpeciesDto } from '#shared/atlas/types'
import { ownSpecies, subpopulationCounts } from '../../atlas/records'
import { speciesDto } from '../../atlas/subpopulation-dto'

export default defineEventHandler(async (event): Promise<SpeciesDto> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const { sequelize, models } = await useDb()
  const species = await ownSpecies(models, user.agencyId, id)
  const counts = await subpopulationCounts(sequelize, user.agencyId)
  return speciesDto(species, counts.get(species.id) ?? 0)
})
