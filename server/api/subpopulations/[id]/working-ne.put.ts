/**
 * PUT /api/subpopulations/:id/working-ne { value, estimateId?, reason, version } → 200 WorkingNeDto.
 *
 * The biologist chooses the working Ne the projections use, and writes why (required). With
 * `estimateId` the value must be that saved estimate's value (422 otherwise); `value: null`
 * clears the working Ne. Records who chose it and when. 409 when `version` (the subpopulation's)
 * is not the current one. Biologists, managers and administrators of the agency.
 */
import { WorkingNeSchema, type WorkingNeDto } from '#shared/schemas/effective-size'
import { sameEffectiveSize, workingNeDto } from '../../../record/effective-size-dto'
import { findRecordSubpopulation, RECORD_WRITERS } from '../../../record/record-subpopulation'

export default defineEventHandler(async (event): Promise<WorkingNeDto> => {
  const user = await requireRole(event, ...RECORD_WRITERS)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const input = await readBodyWith(event, WorkingNeSchema, { maxBytes: 16 * 1024 })
  const { sequelize, models } = await useDb()

  return sequelize.transaction(async (t) => {
    const subpopulation = await findRecordSubpopulation(user, id, { transaction: t, lock: true })
    if (subpopulation.version !== input.version) {
      throw conflict(`Someone else changed ${subpopulation.name} since you loaded it (you had version ${input.version}, it is now ${subpopulation.version}). Reload and try again.`)
    }
    const estimateId = input.estimateId ?? null
    if (estimateId !== null) {
      if (input.value === null) throw unprocessable('A cleared working Ne cannot come from an estimate.', [{ path: 'estimateId', message: 'Leave the estimate out when clearing the working Ne.' }])
      const estimate = await models.EffectiveSizeEstimate.findOne({ where: { id: estimateId, subpopulationId: id }, transaction: t })
      if (!estimate) throw unprocessable(`There is no saved estimate ${estimateId} for ${subpopulation.name}.`, [{ path: 'estimateId', message: 'Choose one of this subpopulation’s saved estimates.' }])
      if (!sameEffectiveSize(estimate.value, input.value)) {
        throw unprocessable(`The chosen estimate is ${estimate.value}, not ${input.value}.`, [{ path: 'value', message: `The chosen estimate is ${estimate.value}; enter the value without an estimate to use another figure.` }])
      }
    }
    const before = workingNeDto(subpopulation, subpopulation.workingNeEstimateId ?? null, null)
    subpopulation.set({
      workingNe: input.value,
      workingNeReason: input.value === null ? null : input.reason,
      workingNeEstimateId: estimateId,
      workingNeSetBy: user.id,
      workingNeSetAt: new Date(),
    })
    await subpopulation.save({ transaction: t })
    const after = workingNeDto(subpopulation, estimateId, { id: user.id, name: user.name })
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'subpopulation.working-ne',
      entityType: 'subpopulation', entityId: subpopulation.id,
      before, after: { ...after, reason: input.reason },
    })
    return after
  })
})
