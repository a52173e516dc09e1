/**
 * GET /api/admin/agency/certificate → 200 SigningCertificateDto: the certificate that signs
 * the agency's briefs (subject, issuer, serial, validity, SHA-256 fingerprint, where it came
 * from). Administrators only. The key itself never leaves the server.
 */
import type { SigningCertificateDto } from '#shared/schemas/brief'

export default defineEventHandler(async (event): Promise<SigningCertificateDto> => {
  const admin = await requireRole(event, 'administrator')
  const { sequelize } = await useDb()
  return signingCertificateDto(await loadAgencyCredential(sequelize, admin.agencyId))
})
