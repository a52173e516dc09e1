/**
 * DELETE /api/attachments/:id → 204. Its uploader or an administrator; anyone else 403
 * (viewers always); another agency's attachment → 404. The record and an audit row go in one
 * transaction, then the file is removed from object storage.
 */
export default defineEventHandler(async (event): Promise<null> => {
  const user = await requireRole(event, 'biologist', 'manager', 'administrator')
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  await deleteAttachment(user, id)
  setResponseStatus(event, 204)
  return null
})
