/**
 * POST /api/verify (public, no sign-in): multipart form with one `file` → 200 VerifyResultDto.
 * Says whether the PDF's signature is valid, who signed it and when, and whether the file is
 * byte for byte a brief this server issued (SHA-256 looked up in the register of issued briefs).
 *
 * 413 past VERIFY_MAX_BYTES (streamed, nothing more is read); 415 when the request is not
 * multipart; 422 when no file was sent or the file is not a PDF.
 */
import { QueryTypes } from 'sequelize'
import { VERIFY_MAX_BYTES, type VerifyResultDto } from '#shared/schemas/brief'
import { readSingleUpload } from '../brief/read-upload'
import { checkPdfSignature } from '../brief/verify-signature'
import { verifyMessage, type RegisterMatch } from '../brief/verify-message'

interface RegisterRow { document_id: string, title: string, agency: string, created_at: Date }

export default defineEventHandler(async (event): Promise<VerifyResultDto> => {
  const upload = await readSingleUpload(event.node.req, { maxBytes: VERIFY_MAX_BYTES })
  if (upload.content.subarray(0, 5).toString('latin1') !== '%PDF-') {
    throw unprocessable('This file is not a PDF. Upload the brief as the PDF file you received.', [{ path: 'file', message: 'Not a PDF file.' }])
  }
  const sha256 = sha256Hex(upload.content)
  const check = checkPdfSignature(upload.content)
  const { sequelize } = await useDb()
  const rows = await sequelize.query<RegisterRow>(
    `SELECT b.document_id, p.title, a.name AS agency, b.created_at
       FROM issued_briefs b JOIN proposals p ON p.id = b.proposal_id JOIN agencies a ON a.id = b.agency_id
      WHERE b.sha256 = :sha256`,
    { replacements: { sha256 }, type: QueryTypes.SELECT },
  )
  const row = rows[0]
  const match: RegisterMatch | null = row ? { documentId: row.document_id, proposalTitle: row.title, agency: row.agency } : null
  setResponseHeader(event, 'cache-control', 'no-store')
  return {
    signatureValid: check.signatureValid,
    signed: check.signed,
    signer: check.signer
      ? {
          commonName: check.signer.commonName,
          subject: check.signer.subject,
          issuer: check.signer.issuer,
          selfSigned: check.signer.selfSigned,
          validFrom: check.signer.validFrom.toISOString(),
          validTo: check.signer.validTo.toISOString(),
          fingerprintSha256: check.signer.fingerprintSha256,
        }
      : null,
    signedAt: check.signedAt ? check.signedAt.toISOString() : null,
    issuedByTributary: row && match ? { ...match, issuedAt: new Date(row.created_at).toISOString() } : null,
    sha256,
    message: verifyMessage(check, match),
  }
})
