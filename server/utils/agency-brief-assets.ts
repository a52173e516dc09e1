/**
 * DTOs and storage of the agency's brief assets: the signing certificate's public facts
 * (SigningCertificateDto) and the letterhead logo (table agency_logos, bytea).
 */
import { QueryTypes, type Transaction } from 'sequelize'
import type { AgencyLogoDto, SigningCertificateDto } from '#shared/schemas/brief'
import type { StoredCredential } from './certificates'

/** The certificate facts shown to administrators (never the key). */
export function signingCertificateDto(credential: StoredCredential | null): SigningCertificateDto {
  if (!credential) {
    return { present: false, subject: null, issuer: null, serialNumber: null, notBefore: null, notAfter: null, fingerprintSha256: null, selfSigned: null, origin: null, updatedAt: null }
  }
  const { info } = credential
  return {
    present: true,
    subject: info.subject,
    issuer: info.issuer,
    serialNumber: info.serialNumber,
    notBefore: info.notBefore.toISOString(),
    notAfter: info.notAfter.toISOString(),
    fingerprintSha256: info.fingerprintSha256,
    selfSigned: info.selfSigned,
    origin: credential.origin,
    updatedAt: credential.updatedAt.toISOString(),
  }
}

/** The logo's facts (without the bytes). */
export async function loadAgencyLogo(agencyId: number, transaction?: Transaction): Promise<AgencyLogoDto> {
  const { sequelize } = await useDb()
  const rows = await sequelize.query<{ content_type: 'image/png' | 'image/jpeg', size_bytes: number, sha256: string, updated_at: Date }>(
    'SELECT content_type, size_bytes, sha256, updated_at FROM agency_logos WHERE agency_id = :agencyId',
    { replacements: { agencyId }, type: QueryTypes.SELECT, transaction },
  )
  const row = rows[0]
  if (!row) return { present: false, contentType: null, sizeBytes: null, sha256: null, updatedAt: null }
  return { present: true, contentType: row.content_type, sizeBytes: row.size_bytes, sha256: row.sha256, updatedAt: new Date(row.updated_at).toISOString() }
}

/** Stores (or replaces) the agency's logo. */
export async function saveAgencyLogo(logo: { agencyId: number, contentType: 'image/png' | 'image/jpeg', bytes: Buffer, sha256: string, uploadedBy: number | null }, transaction?: Transaction): Promise<void> {
  const { sequelize } = await useDb()
  await sequelize.query(
    `INSERT INTO agency_logos (agency_id, content_type, bytes, size_bytes, sha256, uploaded_by)
     VALUES (:agencyId, :contentType, :bytes, :sizeBytes, :sha256, :uploadedBy)
     ON CONFLICT (agency_id) DO UPDATE SET content_type = EXCLUDED.content_type, bytes = EXCLUDED.bytes,
       size_bytes = EXCLUDED.size_bytes, sha256 = EXCLUDED.sha256, uploaded_by = EXCLUDED.uploaded_by, updated_at = now()`,
    { replacements: { agencyId: logo.agencyId, contentType: logo.contentType, bytes: logo.bytes, sizeBytes: logo.bytes.length, sha256: logo.sha256, uploadedBy: logo.uploadedBy }, transaction },
  )
}
