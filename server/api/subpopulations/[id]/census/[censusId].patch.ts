/**
 * PATCH /api/subpopulations/:id/census/:censusId { any row fields, version } → 200 CensusCountDto.
 * The merged row is checked again (counts ≥ 0, males + females ≤ adults) → 422 at the field;
 * 409 when `version` is not the current one or the new year already has a census; 404 for a row
 * of another subpopulation or agency. Biologists, managers and administrators.
 */
import { z } from 'zod'
import { CensusPatchSchema, CensusRowSchema, type CensusCountDto } from '#shared/schemas/census'
import { censusCountDto } from '../../../../record/census-dto'
import { findRecordSubpopulation, RECORD_WRITERS } from '../../../../record/record-subpopulation'

const ParamsSchema = z.object({ id: RecordIdSchema, censusId: RecordIdSchema })

export default defineEventHandler(async (event): Promise<CensusCountDto> => {
  const user = await requireRole(event, ...RECORD_WRITERS)
  const { id, censusId } = getParamsWith(event, ParamsSchema)
  const patch = await readBodyWith(event, CensusPatchSchema, { maxBytes: 16 * 1024 })
  const { sequelize, models } = await useDb()

  return sequelize.transaction(async (t) => {
    const subpopulation = await findRecordSubpopulation(user, id, { transaction: t, lock: true })
    const row = await models.CensusCount.findOne({ where: { id: censusId, subpopulationId: id }, lock: t.LOCK.UPDATE, transaction: t })
    if (!row) throw notFound('Census row')
    if (row.version !== patch.version) {
      throw conflict(`Someone else changed the ${row.year} census since you loaded it (you had version ${patch.version}, it is now ${row.version}). Reload and try again.`)
    }
    const before = censusCountDto(row)
    const { version: _version, ...changes } = patch
    const merged = parseInputOrThrow(CensusRowSchema, {
      year: row.year, adults: row.adults, males: row.males, females: row.females, method: row.method, source: row.source,
      ...Object.fromEntries(Object.entries(changes).filter(([, value]) => value !== undefined)),
    })
    if (merged.year !== row.year) {
      const clash = await models.CensusCount.findOne({ where: { subpopulationId: id, year: merged.year }, transaction: t })
      if (clash) throw conflict(`${subpopulation.name} already has a census for ${merged.year}. There is one row per year: edit or delete that row first.`)
    }
    row.set({
      year: merged.year, adults: merged.adults, males: merged.males ?? null, females: merged.females ?? null,
      method: merged.method ?? '', source: merged.source ?? '',
    })
    if (!row.changed()) return before
    await row.save({ transaction: t })
    const after = censusCountDto(row)
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'census.update',
      entityType: 'census_count', entityId: row.id, before, after,
    })
    return after
  })
})
