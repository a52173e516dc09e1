/**
 * GET /api/genotypes/:id/download → 200 { url, expiresAt, expiresInSeconds }, or with
 * `?redirect=true` a 302 to that link: a short-lived presigned link to the uploaded file
 * (NUXT_S3_DOWNLOAD_LINK_SECONDS, 5 minutes by default). Any signed-in role; another agency's
 * dataset → 404. Demo files missing from storage are put back first.
 */
import { AttachmentDownloadQuerySchema, type AttachmentDownloadResponse } from '#shared/schemas/attachments'

export default defineEventHandler(async (event): Promise<AttachmentDownloadResponse | undefined> => {
  const user = await requireUser(event)
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const { redirect } = getQueryWith(event, AttachmentDownloadQuerySchema)
  const row = await requireAgencyDataset(user, id)
  await loadGenotypeDataset(row) // restores a missing demo file; checks the bytes
  const link = await useObjectStore().downloadLink(row.storageKey, {
    fileName: row.fileName,
    contentType: row.format === 'vcf' ? 'text/plain; charset=utf-8' : 'text/csv; charset=utf-8',
  }).catch((error: unknown) => { throw asObjectStoreError(error, 'read') })
  setResponseHeader(event, 'cache-control', 'no-store')
  if (redirect) {
    await sendRedirect(event, link.url, 302)
    return undefined
  }
  return { url: link.url, expiresAt: link.expiresAt.toISOString(), expiresInSeconds: link.expiresInSeconds }
})
