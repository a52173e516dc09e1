/**
 * GET /api/species → 200 { items: SpeciesDto[] } — the agency's species by common name, each
 * with its number of subpopulations. Any signed-in role.
 */
import type { SpeciesListResponse } from '#shared/atlas/types'
import { speciesDto } from '../../atlas/subpopulation-dto'
import { subpopulationCounts } from '../../atlas/records'

export default defineEventHandler(async (event): Promise<SpeciesListResponse> => {
  const user = await requireUser(event)
  const { sequelize, models } = await useDb()
  const species = await models.Species.findAll({ where: agencyScope(user), order: [['commonName', 'ASC'], ['id', 'ASC']] })
  const counts = await subpopulationCounts(sequelize, user.agencyId)
  return { items: species.map(row => speciesDto(row, counts.get(row.id) ?? 0)) }
})
