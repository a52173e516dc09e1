/**
 * pdfmake document definition → PDF bytes, optionally with an empty signature field ready for
 * `signPdf` (server/utils/signing.ts).
 *
 * pdfmake 0.3's Node entry is one shared instance: fonts are set on every call (cheap), remote
 * URLs are refused (`setUrlAccessPolicy(() => false)`) and local file access is limited to the
 * font directory, so nothing in a document definition can read other files. Images come in as
 * data URLs only.
 */
// eslint-disable-next-line @typescript-eslint/triple-slash-reference -- pdfmake ships no types; this brings our declaration into every tsconfig project that compiles this file (tests, bench, server)
/// <reference path="./pdfmake.d.ts" />
import pdfmake from 'pdfmake'
import { pdfkitAddPlaceholder } from '@signpdf/placeholder-pdfkit'
import type { BriefFontTable } from './fonts'
import type { PdfDocumentDefinition } from './pdf-types'

/**
 * Room for the CMS signature, bytes (printed as twice as many hex digits). A signature with a
 * 2048-bit key and one certificate is about 1.6 KB; 16 KB leaves room for certificate chains.
 */
export const SIGNATURE_PLACEHOLDER_BYTES = 16_384

/** What the signature dictionary says besides the signature itself. */
export interface SignatureField {
  reason: string
  /** Signer's name as shown by readers. */
  name: string
  location: string
  contactInfo: string
  signingTime: Date
}

/**
 * Renders a document definition.
 *
 * @param definition - from `buildBriefDocument`
 * @param fonts - from `ensureBriefFonts` (absolute paths in `directory`)
 * @param signatureField - when given, an invisible signature field with an empty placeholder is
 *   added to the last page before the document ends, so the bytes can be signed afterwards
 * @returns the PDF bytes
 */
export async function renderPdf(definition: PdfDocumentDefinition, fonts: { directory: string, fonts: BriefFontTable }, signatureField?: SignatureField): Promise<Buffer> {
  pdfmake.setFonts(structuredClone(fonts.fonts))
  pdfmake.setUrlAccessPolicy(() => false)
  pdfmake.setLocalAccessPolicy((path: string) => path.startsWith(fonts.directory))
  const document = await pdfmake.createPdf(definition).getStream()
  if (signatureField) {
    pdfkitAddPlaceholder({
      pdf: document,
      pdfBuffer: Buffer.alloc(0),
      reason: signatureField.reason,
      name: signatureField.name,
      location: signatureField.location,
      contactInfo: signatureField.contactInfo,
      signingTime: signatureField.signingTime,
      signatureLength: SIGNATURE_PLACEHOLDER_BYTES,
      appName: 'Tributary',
    })
  }
  return new Promise<Buffer>((resolve, reject) => {
    const chunks: Buffer[] = []
    document.on('data', (chunk: Buffer) => chunks.push(chunk))
    document.on('end', () => resolve(Buffer.concat(chunks)))
    document.on('error', reject)
    document.end()
  })
}
