/**
 * GET /api/attachments/:id/download → 200 { url, expiresAt, expiresInSeconds }, or with
 * `?redirect=true` a 302 to that link: a presigned object-storage link that works for a short
 * time only (NUXT_S3_DOWNLOAD_LINK_SECONDS, 5 minutes by default) and downloads the file under
 * its own name with its allow-listed content type. Any signed-in role; another agency's
 * attachment → 404.
 */
import { AttachmentDownloadQuerySchema, type AttachmentDownloadResponse } from '#shared/schemas/attachments'

export default defineEventHandler(async (event): Promise<AttachmentDownloadResponse | undefined> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const { redirect } = getQueryWith(event, AttachmentDownloadQuerySchema)
  const row = await requireAgencyAttachment(user, id)
  const link = await useObjectStore().downloadLink(row.storageKey, { fileName: row.fileName, contentType: row.contentType })
    .catch((error: unknown) => { throw asObjectStoreError(error, 'read') })
  setResponseHeader(event, 'cache-control', 'no-store')
  if (redirect) {
    await sendRedirect(event, link.url, 302)
    return undefined
  }
  return { url: link.url, expiresAt: link.expiresAt.toISOString(), expiresInSeconds: link.expiresInSeconds }
})
