/**
 * POST /api/subpopulations/:id/census { year, adults, males?, females?, method?, source? }
 * → 201 CensusCountDto. 409 when the year already has a census (one row per year: edit that
 * row instead); 422 for counts below 0 or males + females above adults. Biologists, managers
 * and administrators of the agency.
 */
import { CensusRowSchema, type CensusCountDto } from '#shared/schemas/census'
import { censusCountDto } from '../../../../record/census-dto'
import { findRecordSubpopulation, RECORD_WRITERS } from '../../../../record/record-subpopulation'

export default defineEventHandler(async (event): Promise<CensusCountDto> => {
  const user = await requireRole(event, ...RECORD_WRITERS)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const input = await readBodyWith(event, CensusRowSchema, { maxBytes: 16 * 1024 })
  const { sequelize, models } = await useDb()

  const created = await sequelize.transaction(async (t) => {
    const subpopulation = await findRecordSubpopulation(user, id, { transaction: t, lock: true })
    const existing = await models.CensusCount.findOne({ where: { subpopulationId: id, year: input.year }, transaction: t })
    if (existing) {
      throw conflict(`${subpopulation.name} already has a census for ${input.year} (${existing.adults} adults). Edit that row instead; there is one row per year.`)
    }
    const row = await models.CensusCount.create({
      subpopulationId: id,
      year: input.year,
      adults: input.adults,
      males: input.males ?? null,
      females: input.females ?? null,
      method: input.method ?? '',
      source: input.source ?? '',
    }, { transaction: t })
    const after = censusCountDto(row)
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'census.create',
      entityType: 'census_count', entityId: row.id, before: null, after,
    })
    return after
  })
  setResponseStatus(event, 201)
  return created
})
