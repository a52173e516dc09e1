/**
 * DELETE /api/genotypes/:id → 204. Its uploader or an administrator (others 403, viewers
 * included); another agency's dataset → 404. The record goes, the species comparisons are
 * recomputed and an audit row is written in one transaction; then the file is removed from
 * object storage. 503 when storage is down (nothing deleted).
 */
export default defineEventHandler(async (event): Promise<null> => {
  const user = await requireRole(event, 'biologist', 'manager', 'administrator')
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  await deleteGenotypeDataset(user, id)
  setResponseStatus(event, 204)
  return null
})
