/**
 * POST /api/admin/agency/certificate — multipart form: `file` (a PKCS#12, .p12 or .pfx, at most
 * 64 KB) and `passphrase` → 200 SigningCertificateDto. Administrators only.
 *
 * The file must open with the passphrase, hold an RSA private key with its certificate, and
 * the certificate must be valid now (422 with the reason otherwise). It replaces the agency's
 * signing certificate for briefs issued from now on; briefs already issued keep their
 * signature. Stored re-encrypted under the server's signing passphrase; the uploaded
 * passphrase is not kept. Audited as 'agency.certificate.upload'.
 */
import { CERTIFICATE_MAX_BYTES, type SigningCertificateDto } from '#shared/schemas/brief'
import { readSingleUpload } from '../../../brief/read-upload'

export default defineEventHandler(async (event): Promise<SigningCertificateDto> => {
  const admin = await requireRole(event, 'administrator')
  const upload = await readSingleUpload(event.node.req, { maxBytes: CERTIFICATE_MAX_BYTES, fieldNames: ['passphrase'] })
  let opened
  try {
    opened = openSigningPkcs12(upload.content, upload.fields.passphrase ?? '')
  } catch (error) {
    if (error instanceof CertificateProblem) throw unprocessable(error.message, [{ path: 'file', message: error.message }])
    throw error
  }
  const { sequelize } = await useDb()
  return sequelize.transaction(async (transaction) => {
    const before = await loadAgencyCredential(sequelize, admin.agencyId, transaction)
    await saveAgencyCredential(sequelize, {
      agencyId: admin.agencyId,
      pkcs12: rewrapForStorage(opened, signingPassphrase()),
      info: opened.info,
      origin: 'uploaded',
      uploadedBy: admin.id,
    }, transaction)
    const after = await loadAgencyCredential(sequelize, admin.agencyId, transaction)
    const dto = signingCertificateDto(after)
    await recordAudit(transaction, {
      agencyId: admin.agencyId, actorId: admin.id, action: 'agency.certificate.upload', entityType: 'agency', entityId: admin.agencyId,
      before: before ? signingCertificateDto(before) : null, after: dto,
    })
    return dto
  })
})
