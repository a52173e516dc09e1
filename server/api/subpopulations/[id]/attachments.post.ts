/**
 * POST /api/subpopulations/:id/attachments (multipart/form-data with one `file`) → 201
 * AttachmentDto. Accepted: pdf, png, jpg/jpeg, csv, txt, docx, xlsx (name ending and first
 * bytes must agree), at most 20 MB, streamed to object storage with its SHA-256; the record and
 * an audit row in one transaction (the stored file is removed if that fails). 413 over the
 * limit, 415 for another type, 422 without a file, 503 when storage is down. Biologists,
 * managers and administrators; viewers 403; another agency's subpopulation 404.
 */
import type { AttachmentDto } from '#shared/schemas/attachments'

export default defineEventHandler(async (event): Promise<AttachmentDto> => {
  const user = await requireRole(event, 'biologist', 'manager', 'administrator')
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const subpopulation = await requireAgencySubpopulation(user, id)
  const row = await createSubpopulationAttachment(event.node.req, user, subpopulation)
  setResponseStatus(event, 201)
  return attachmentDto(row, user)
})
