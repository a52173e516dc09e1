/**
 * DELETE /api/subpopulations/:id/effective-sizes/:estimateId → 200 { message }. 409 when the
 * estimate is the source of the current working Ne (choose another working Ne first); 404 for an
 * estimate of another subpopulation or agency. Biologists, managers and administrators; the
 * audit log keeps the estimate.
 */
import { z } from 'zod'
import type { ApiMessage } from '#shared/types/api'
import { effectiveSizeEstimateDto, sameEffectiveSize } from '../../../../record/effective-size-dto'
import { findRecordSubpopulation, RECORD_WRITERS } from '../../../../record/record-subpopulation'

const ParamsSchema = z.object({ id: RecordIdSchema, estimateId: RecordIdSchema })

export default defineEventHandler(async (event): Promise<ApiMessage> => {
  const user = await requireRole(event, ...RECORD_WRITERS)
  const { id, estimateId } = getParamsWith(event, ParamsSchema)
  const { sequelize, models } = await useDb()

  return sequelize.transaction(async (t) => {
    const subpopulation = await findRecordSubpopulation(user, id, { transaction: t, lock: true })
    const estimate = await models.EffectiveSizeEstimate.findOne({ where: { id: estimateId, subpopulationId: id }, lock: t.LOCK.UPDATE, transaction: t })
    if (!estimate) throw notFound('Estimate')
    if (subpopulation.workingNeEstimateId === estimate.id) {
      if (subpopulation.workingNe !== null && sameEffectiveSize(estimate.value, subpopulation.workingNe)) {
        throw conflict('This estimate is the source of the working Ne. Choose another working Ne first, then delete it.')
      }
      // The working Ne was changed elsewhere since it was taken from this estimate: drop the stale
      // link (housekeeping, so without a new version of the record).
      await sequelize.query('UPDATE subpopulations SET working_ne_estimate_id = NULL WHERE id = :id', { replacements: { id }, transaction: t })
    }
    const before = effectiveSizeEstimateDto(estimate, null)
    await estimate.destroy({ transaction: t })
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'effective-size.delete',
      entityType: 'effective_size_estimate', entityId: estimate.id, before, after: null,
    })
    return { message: `The ${before.methodLabel.toLowerCase()} estimate (Ne ${before.value}) was deleted.` }
  })
})
