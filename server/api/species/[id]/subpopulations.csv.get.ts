/**
 * GET /api/species/:id/subpopulations.csv → 200 text/csv, as a download (Content-Disposition:
 * attachment): one row per subpopulation with its centroid as latitude/longitude, attributes,
 * working Ne and status. 404 for another agency's species. Any signed-in role.
 */
import { exportFileName, subpopulationsToCsv } from '#shared/atlas/export'
import { ownSpecies } from '../../../atlas/records'
import { loadSubpopulationDtos } from '../../../atlas/subpopulation-dto'
import { attachmentDisposition } from '../../../atlas/download'

export default defineEventHandler(async (event): Promise<string> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const db = await useDb()
  const species = await ownSpecies(db.models, user.agencyId, id)
  const items = await loadSubpopulationDtos(db, { agencyId: user.agencyId, speciesId: species.id })
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', attachmentDisposition(exportFileName(species.commonName, 'csv')))
  setResponseHeader(event, 'cache-control', 'no-store')
  return subpopulationsToCsv(items)
})
