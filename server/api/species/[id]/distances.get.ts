/**
 * GET /api/species/:id/distances → 200 DistanceMatrixResponse: great-circle distances between
 * the centroids and between the nearest boundary points of the species' subpopulations (km),
 * and each one's nearest neighbour. The full matrices are left out (null) above
 * DISTANCE_MATRIX_LIMIT subpopulations; nearest neighbours are always given.
 * 404 for another agency's species. Any signed-in role.
 */
import { distanceTable } from '#shared/atlas/distances'
import type { DistanceMatrixResponse } from '#shared/atlas/types'
import { ownSpecies } from '../../../atlas/records'

export default defineEventHandler(async (event): Promise<DistanceMatrixResponse> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const { models } = await useDb()
  const species = await ownSpecies(models, user.agencyId, id)
  const rows = await models.Subpopulation.findAll({
    where: { agencyId: user.agencyId, speciesId: species.id },
    attributes: ['id', 'name', 'geometry', 'centroidLon', 'centroidLat'],
  })
  return distanceTable(rows.map(row => ({
    id: row.id,
    name: row.name,
    geometry: row.geometry ?? null,
    centroid: row.centroidLon !== null && row.centroidLat !== null ? { lon: row.centroidLon, lat: row.centroidLat } : null,
  })))
})
