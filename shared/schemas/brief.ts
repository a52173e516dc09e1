/**
 * Shapes of the brief routes (PDF brief, its signature and the public verify page):
 *   - GET  /api/proposals/:id/brief      → BriefStatusDto (what the brief panel shows)
 *   - GET  /api/proposals/:id/brief.pdf  → the PDF (signed when approved, else a draft preview)
 *   - POST /api/verify (multipart `file`) → VerifyResultDto (public, no sign-in)
 *   - GET|POST /api/admin/agency/certificate → SigningCertificateDto
 *   - POST /api/admin/agency/logo        → AgencyLogoDto
 * Dates are ISO 8601 strings.
 */

/** Largest PDF the verify page accepts (bytes). */
export const VERIFY_MAX_BYTES = 10 * 1024 * 1024
/** Largest letterhead logo (bytes). */
export const LOGO_MAX_BYTES = 1024 * 1024
/** Largest PKCS#12 upload (bytes). */
export const CERTIFICATE_MAX_BYTES = 64 * 1024

/** The certificate that signed a file, as the verify page shows it. */
export interface SignerDto {
  commonName: string
  subject: string
  issuer: string
  /** Issued by the signer itself: nobody outside vouches for the name. */
  selfSigned: boolean
  validFrom: string
  validTo: string
  fingerprintSha256: string
}

/** POST /api/verify */
export interface VerifyResultDto {
  /** The signature is intact and covers the whole file. */
  signatureValid: boolean
  /** The file carries a signature at all. */
  signed: boolean
  signer: SignerDto | null
  /** Signing time written in the signature. */
  signedAt: string | null
  /** The file is byte for byte a brief this server issued (matched by SHA-256). */
  issuedByTributary: { documentId: string, proposalTitle: string, agency: string, issuedAt: string } | null
  /** SHA-256 of the uploaded file, lower-case hex. */
  sha256: string
  /** The answer in plain words. */
  message: string
}

/** A brief issued on approval. */
export interface IssuedBriefDto {
  documentId: string
  sha256: string
  sizeBytes: number
  signerSubject: string
  signedAt: string
}

/** GET /api/proposals/:id/brief */
export interface BriefStatusDto {
  proposalId: number
  proposalStatus: string
  /** 'issued' once approved and signed; otherwise 'draft' (a preview, marked and unsigned). */
  state: 'issued' | 'draft'
  issued: IssuedBriefDto | null
  /** Inline PDF (for the preview frame). */
  pdfUrl: string
  /** The same PDF as a download. */
  downloadUrl: string
  fileName: string
}

/** GET|POST /api/admin/agency/certificate */
export interface SigningCertificateDto {
  /** False before a certificate exists (one is made at set-up or on the first approval). */
  present: boolean
  subject: string | null
  issuer: string | null
  serialNumber: string | null
  notBefore: string | null
  notAfter: string | null
  fingerprintSha256: string | null
  selfSigned: boolean | null
  origin: 'generated' | 'uploaded' | null
  updatedAt: string | null
}

/** POST /api/admin/agency/logo */
export interface AgencyLogoDto {
  present: boolean
  contentType: 'image/png' | 'image/jpeg' | null
  sizeBytes: number | null
  sha256: string | null
  updatedAt: string | null
}
