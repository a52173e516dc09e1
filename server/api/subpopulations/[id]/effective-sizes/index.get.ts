/**
 * GET /api/subpopulations/:id/effective-sizes → 200 { items, working } — every saved estimate
 * with its provenance (method, inputs, value, interval, date, source, who), newest first, and
 * the working Ne with who chose it, when and why. Any signed-in role of the agency.
 */
import type { EffectiveSizeListResponse } from '#shared/schemas/effective-size'
import { loadEffectiveSizeRecord } from '../../../../record/effective-size-record'
import { findRecordSubpopulation } from '../../../../record/record-subpopulation'

export default defineEventHandler(async (event): Promise<EffectiveSizeListResponse> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const subpopulation = await findRecordSubpopulation(user, id)
  return loadEffectiveSizeRecord(subpopulation)
})
