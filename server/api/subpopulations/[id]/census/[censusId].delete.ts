/**
 * DELETE /api/subpopulations/:id/census/:censusId → 200 { message }. 404 for a row of another
 * subpopulation or agency. Biologists, managers and administrators; the audit log keeps the row.
 */
import { z } from 'zod'
import type { ApiMessage } from '#shared/types/api'
import { censusCountDto } from '../../../../record/census-dto'
import { findRecordSubpopulation, RECORD_WRITERS } from '../../../../record/record-subpopulation'

const ParamsSchema = z.object({ id: RecordIdSchema, censusId: RecordIdSchema })

export default defineEventHandler(async (event): Promise<ApiMessage> => {
  const user = await requireRole(event, ...RECORD_WRITERS)
  const { id, censusId } = getParamsWith(event, ParamsSchema)
  const { sequelize, models } = await useDb()

  return sequelize.transaction(async (t) => {
    await findRecordSubpopulation(user, id, { transaction: t, lock: true })
    const row = await models.CensusCount.findOne({ where: { id: censusId, subpopulationId: id }, lock: t.LOCK.UPDATE, transaction: t })
    if (!row) throw notFound('Census row')
    const before = censusCountDto(row)
    await row.destroy({ transaction: t })
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'census.delete',
      entityType: 'census_count', entityId: before.id, before, after: null,
    })
    return { message: `The ${before.year} census was deleted.` }
  })
})
