/**
 * GET /api/subpopulations/:id/census → 200 { items: CensusCountDto[] } — the census series,
 * oldest year first. Any signed-in role of the agency; another agency's record answers 404.
 */
import type { CensusListResponse } from '#shared/schemas/census'
import { censusCountDto } from '../../../../record/census-dto'
import { findRecordSubpopulation } from '../../../../record/record-subpopulation'

export default defineEventHandler(async (event): Promise<CensusListResponse> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const { models } = await useDb()
  await findRecordSubpopulation(user, id)
  const rows = await models.CensusCount.findAll({ where: { subpopulationId: id }, order: [['year', 'ASC']] })
  return { items: rows.map(censusCountDto) }
})
