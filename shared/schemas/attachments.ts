/**
 * Files attached to a subpopulation record (permits, reports, photos): the accepted types and
 * size limit, the download query and the answer shapes. Read by the attachment routes
 * (server/api/subpopulations/[id]/attachments.*, server/api/attachments/*), by
 * server/utils/uploads.ts (through the rules passed in) and by components/subpopulation/SubpopulationFiles.vue.
 */
import { z } from 'zod'

/** Largest attachment accepted (bytes). */
export const ATTACHMENT_MAX_BYTES = 20 * 1024 * 1024

/** One accepted attachment type: the file-name ending, the content type stored and served, words for people. */
export interface AttachmentType {
  extension: string
  contentType: string
  label: string
}

/** The allow-list: anything else is refused (415). The content type comes from here, never from the browser. */
export const ATTACHMENT_TYPES: readonly AttachmentType[] = [
  { extension: '.pdf', contentType: 'application/pdf', label: 'PDF' },
  { extension: '.png', contentType: 'image/png', label: 'PNG image' },
  { extension: '.jpg', contentType: 'image/jpeg', label: 'JPEG image' },
  { extension: '.jpeg', contentType: 'image/jpeg', label: 'JPEG image' },
  { extension: '.csv', contentType: 'text/csv; charset=utf-8', label: 'CSV table' },
  { extension: '.txt', contentType: 'text/plain; charset=utf-8', label: 'Text' },
  { extension: '.docx', contentType: 'application/vnd.openxmlformats-officedocument.wordprocessingml.document', label: 'Word document' },
  { extension: '.xlsx', contentType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet', label: 'Excel workbook' },
]

/** The endings as people read them: "pdf, png, jpg, …". */
export const ATTACHMENT_EXTENSIONS_TEXT = ATTACHMENT_TYPES.map(type => type.extension.slice(1)).join(', ')

/** Query of GET /api/attachments/:id/download: `redirect=true` answers 302 to the link instead of JSON. */
export const AttachmentDownloadQuerySchema = z.object({
  redirect: z.enum(['true', 'false', '1', '0'], { error: 'Use redirect=true or redirect=false.' }).optional()
    .transform(value => value === 'true' || value === '1'),
})

/** One attachment as lists show it. */
export interface AttachmentDto {
  id: number
  ownerType: 'subpopulation'
  ownerId: number
  fileName: string
  contentType: string
  /** the allow-list label ("PDF", "PNG image") */
  typeLabel: string
  sizeBytes: number
  checksumSha256: string
  uploadedBy: { id: number, name: string } | null
  createdAt: string
  /** the signed-in user may delete it (its uploader or an administrator) */
  canDelete: boolean
}

/** GET /api/subpopulations/:id/attachments */
export interface AttachmentListResponse {
  items: AttachmentDto[]
  canUpload: boolean
  limits: { maxBytes: number, extensions: string[] }
}

/** GET /api/attachments/:id/download (JSON form) */
export interface AttachmentDownloadResponse {
  url: string
  expiresAt: string
  expiresInSeconds: number
}
