/**
 * GET /api/subpopulations/:id/attachments → 200 AttachmentListResponse: the files attached to
 * the subpopulation, newest first, whether the caller may attach more, and the limits. Any
 * signed-in role; another agency's subpopulation → 404.
 */
import { ATTACHMENT_MAX_BYTES, ATTACHMENT_TYPES, type AttachmentListResponse } from '#shared/schemas/attachments'

export default defineEventHandler(async (event): Promise<AttachmentListResponse> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const subpopulation = await requireAgencySubpopulation(user, id)
  const { models } = await useDb()
  const rows = await models.Attachment.findAll({
    where: { agencyId: user.agencyId, ownerType: 'subpopulation', ownerId: subpopulation.id },
    include: [{ model: models.User, as: 'uploader', required: false, attributes: ['id', 'name'] }],
    order: [['createdAt', 'DESC'], ['id', 'DESC']],
  }) as AttachmentRow[]
  return {
    items: rows.map(row => attachmentDto(row, user)),
    canUpload: mayAttachFiles(user.role),
    limits: { maxBytes: ATTACHMENT_MAX_BYTES, extensions: ATTACHMENT_TYPES.map(type => type.extension) },
  }
})
