/**
 * GET /api/species/:id/subpopulations.geojson → 200 application/geo+json, as a download
 * (Content-Disposition: attachment): a FeatureCollection of the species' subpopulations with
 * their attributes, working Ne and status. 404 for another agency's species. Any signed-in role.
 */
import { exportFileName, subpopulationsToGeoJson } from '#shared/atlas/export'
import { ownSpecies } from '../../../atlas/records'
import { loadSubpopulationDtos } from '../../../atlas/subpopulation-dto'
import { attachmentDisposition } from '../../../atlas/download'

export default defineEventHandler(async (event): Promise<string> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const db = await useDb()
  const species = await ownSpecies(db.models, user.agencyId, id)
  const items = await loadSubpopulationDtos(db, { agencyId: user.agencyId, speciesId: species.id })
  setResponseHeader(event, 'content-type', 'application/geo+json; charset=utf-8')
  setResponseHeader(event, 'content-disposition', attachmentDisposition(exportFileName(species.commonName, 'geojson')))
  setResponseHeader(event, 'cache-control', 'no-store')
  return JSON.stringify(subpopulationsToGeoJson(items), null, 1)
})
