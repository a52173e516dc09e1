/**
 * Signs a PDF that carries an empty signature field (server/brief/render.ts `renderPdf` with
 * a `signatureField`): @signpdf fills the byte range and writes a detached CMS signature
 * (SHA-256, adbe.pkcs7.detached) made with the agency's PKCS#12 — a real signature that PDF
 * readers and `pdfsig` verify. A new signer per signature (the library keeps state in it).
 */
import { createHash } from 'node:crypto'
import { SignPdf } from '@signpdf/signpdf'
import { P12Signer } from '@signpdf/signer-p12'

/**
 * Signs the PDF.
 *
 * @param pdf - bytes with a signature placeholder
 * @param pkcs12 - the credential
 * @param passphrase - its passphrase
 * @param signingTime - the time written into the signature's signed attributes
 * @returns the signed bytes and their SHA-256 (lower-case hex)
 */
export async function signPdf(pdf: Buffer, pkcs12: Buffer, passphrase: string, signingTime: Date): Promise<{ pdf: Buffer, sha256: string }> {
  const signed = await new SignPdf().sign(pdf, new P12Signer(pkcs12, { passphrase }), signingTime)
  return { pdf: signed, sha256: createHash('sha256').update(signed).digest('hex') }
}
