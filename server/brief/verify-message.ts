/**
 * The verify page's answer in plain words, from the signature check and the register lookup.
 * Honest about what a signature shows: that the file is unchanged since signing and which
 * certificate signed it; a self-signed certificate's name is vouched for by nobody else.
 */
import type { SignatureCheck } from './verify-signature'

/** A brief found in the register by the file's SHA-256. */
export interface RegisterMatch {
  documentId: string
  proposalTitle: string
  agency: string
}

function day(date: Date | null): string {
  if (!date) return 'an unrecorded time'
  return `${date.toISOString().slice(0, 16).replace('T', ' ')} UTC`
}

/**
 * One short paragraph for the person who uploaded the file.
 *
 * @param check - from `checkPdfSignature`
 * @param match - the issued brief with the same SHA-256, or null
 */
export function verifyMessage(check: SignatureCheck, match: RegisterMatch | null): string {
  if (!check.signed) return match
    ? 'This file carries no digital signature, yet it matches a brief in the register — this should not happen; ask the issuing agency.'
    : 'This PDF carries no digital signature, so there is nothing to check. A brief issued by Tributary is always signed.'
  if (!check.signatureValid) {
    const who = check.signer ? ` (signed by ${check.signer.commonName})` : ''
    return `Not valid${who}. ${check.problem ?? 'The signature does not match the file.'} Do not rely on this copy; ask the issuing agency for the original.`
  }
  const signer = check.signer?.commonName ?? 'an unnamed signer'
  const trust = check.signer?.selfSigned
    ? ` The certificate was issued by ${signer} itself (self-signed), so the name rests on the agency's word, not on an outside authority.`
    : ''
  const expired = check.certificateValidAtSigning === false ? ' Note: the certificate was not valid at the time written in the signature.' : ''
  if (match) {
    return `Valid. The signature by ${signer} on ${day(check.signedAt)} is intact, and this file is exactly the brief Tributary issued as document ${match.documentId} ("${match.proposalTitle}", ${match.agency}).${trust}${expired}`
  }
  return `The signature by ${signer} on ${day(check.signedAt)} is intact: the file has not changed since it was signed. It does not match any brief issued by this Tributary server, so it was not issued here.${trust}${expired}`
}
