/**
 * POST /api/admin/agency/logo — multipart form with one `file` (PNG or JPEG, at most 1 MB) →
 * 200 AgencyLogoDto. Administrators only. The logo heads the letterhead of briefs built from
 * now on (issued briefs keep theirs). Streamed with a size limit (413 beyond); a file that is
 * not a PNG or JPEG answers 415 (by name ending) or 415 (contents). Audited as 'agency.logo.upload'.
 */
import { LOGO_MAX_BYTES, type AgencyLogoDto } from '#shared/schemas/brief'
import { receiveUpload, type UploadTypeRule } from '../../../utils/uploads'

/** PNG: the 8-byte signature. JPEG: SOI marker followed by another marker. */
const isPng = (head: Buffer) => head.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A]))
const isJpeg = (head: Buffer) => head.length >= 3 && head[0] === 0xFF && head[1] === 0xD8 && head[2] === 0xFF

const LOGO_TYPES: UploadTypeRule[] = [
  { extension: '.png', contentType: 'image/png', label: 'PNG', sniff: isPng },
  { extension: '.jpg', contentType: 'image/jpeg', label: 'JPEG', sniff: isJpeg },
  { extension: '.jpeg', contentType: 'image/jpeg', label: 'JPEG', sniff: isJpeg },
]

export default defineEventHandler(async (event): Promise<AgencyLogoDto> => {
  const admin = await requireRole(event, 'administrator')
  const upload = await receiveUpload(event.node.req, {
    maxFileBytes: LOGO_MAX_BYTES,
    types: LOGO_TYPES,
    fieldNames: [],
    keepContent: true,
    store: async (body) => {
      for await (const _chunk of body) { /* kept in memory by keepContent; stored below */ }
    },
  })
  const content = upload.file.content ?? Buffer.alloc(0)
  const { sequelize } = await useDb()
  return sequelize.transaction(async (transaction) => {
    const before = await loadAgencyLogo(admin.agencyId, transaction)
    await saveAgencyLogo({ agencyId: admin.agencyId, contentType: upload.file.contentType as 'image/png' | 'image/jpeg', bytes: content, sha256: upload.file.sha256, uploadedBy: admin.id }, transaction)
    const after = await loadAgencyLogo(admin.agencyId, transaction)
    await recordAudit(transaction, {
      agencyId: admin.agencyId, actorId: admin.id, action: 'agency.logo.upload', entityType: 'agency', entityId: admin.agencyId,
      before, after,
    })
    return after
  })
})
