/**
 * Checks the digital signature of a PDF the way a reader does, in JavaScript (node:crypto for
 * the hash and public-key arithmetic, ./der.ts to read the CMS structure; no external tools):
 *
 * 1. the last signature dictionary's /ByteRange [a b c d] names the signed bytes — everything
 *    except the /Contents hex string that holds the signature; it must start at 0 and, for the
 *    file to be unchanged since signing, end at the end of the file;
 * 2. /Contents is a CMS SignedData (RFC 5652). Its signer info carries the SHA-256 (or other)
 *    digest of the signed bytes as the messageDigest signed attribute; we recompute it;
 * 3. the signed attributes, DER-encoded as a SET, are verified against the signature value with
 *    the signer certificate's public key (RSA PKCS#1 v1.5 or ECDSA).
 * A changed byte anywhere in the signed ranges changes the digest; a changed byte in the
 * signature itself breaks the structure or the signature check; bytes added after signing fall
 * outside the byte range. Each case answers "not valid" with its reason in plain words.
 *
 * What this does not do: decide whether the signer's certificate is trustworthy (a self-signed
 * agency certificate is reported as such), check revocation, or validate certificate chains.
 */
import { createHash, verify, X509Certificate, constants } from 'node:crypto'
import { bytes, children, integerHex, isContext, isUniversal, oidText, readNode, TAG, timeValue, value, type DerNode } from './der'

/** The certificate that made the signature, as people need to see it. */
export interface SignerFacts {
  commonName: string
  /** 'CN=…, O=…' */
  subject: string
  issuer: string
  selfSigned: boolean
  validFrom: Date
  validTo: Date
  /** SHA-256 of the certificate, lower-case hex. */
  fingerprintSha256: string
}

export interface SignatureCheck {
  /** A signature dictionary with a byte range was found. */
  signed: boolean
  /** The signature is intact and covers the whole file. */
  signatureValid: boolean
  /** The signed byte range ends at the end of the file (nothing was added after signing). */
  coversWholeFile: boolean
  /** signingTime from the signed attributes (else null). */
  signedAt: Date | null
  signer: SignerFacts | null
  /** True when signedAt lies within the certificate's validity (null when unknown). */
  certificateValidAtSigning: boolean | null
  /** Why the signature is not valid, in plain words (null when valid). */
  problem: string | null
}

const OID = {
  signedData: '1.2.840.113549.1.7.2',
  data: '1.2.840.113549.1.7.1',
  contentType: '1.2.840.113549.1.9.3',
  messageDigest: '1.2.840.113549.1.9.4',
  signingTime: '1.2.840.113549.1.9.5',
} as const

const DIGESTS: Record<string, string> = {
  '1.3.14.3.2.26': 'sha1',
  '2.16.840.1.101.3.4.2.1': 'sha256',
  '2.16.840.1.101.3.4.2.2': 'sha384',
  '2.16.840.1.101.3.4.2.3': 'sha512',
}

/** Signature algorithms: RSA PKCS#1 v1.5 (plain or with the digest named) and ECDSA. */
const RSA_SIGNATURES = new Set(['1.2.840.113549.1.1.1', '1.2.840.113549.1.1.5', '1.2.840.113549.1.1.11', '1.2.840.113549.1.1.12', '1.2.840.113549.1.1.13'])
const ECDSA_SIGNATURES = new Set(['1.2.840.10045.4.3.2', '1.2.840.10045.4.3.3', '1.2.840.10045.4.3.4', '1.2.840.10045.2.1'])

class NotValid extends Error {}

function fail(message: string): never {
  throw new NotValid(message)
}

/** The last /ByteRange [a b c d] in the file, or null. */
export function findByteRange(pdf: Buffer): [number, number, number, number] | null {
  const text = pdf.toString('latin1')
  const pattern = /\/ByteRange\s*\[\s*(\d+)\s+(\d+)\s+(\d+)\s+(\d+)\s*\]/g
  let last: RegExpExecArray | null = null
  for (let match = pattern.exec(text); match; match = pattern.exec(text)) last = match
  if (!last) return null
  return [Number(last[1]), Number(last[2]), Number(last[3]), Number(last[4])]
}

function lines(distinguishedName: string): string {
  return distinguishedName.split('\n').map(part => part.trim()).filter(Boolean).join(', ')
}

function signerFacts(certificate: X509Certificate): SignerFacts {
  const subject = lines(certificate.subject)
  const issuer = lines(certificate.issuer)
  const commonName = /(?:^|\n)CN=([^\n]+)/.exec(certificate.subject)?.[1] ?? subject
  return {
    commonName,
    subject,
    issuer,
    selfSigned: certificate.subject === certificate.issuer && certificate.verify(certificate.publicKey),
    validFrom: new Date(certificate.validFrom),
    validTo: new Date(certificate.validTo),
    fingerprintSha256: certificate.fingerprint256.replace(/:/g, '').toLowerCase(),
  }
}

/** The signature's DER bytes from the /Contents hex string between the two byte ranges. */
function signatureBytes(pdf: Buffer, [, b, c]: [number, number, number, number]): Buffer {
  const hole = pdf.subarray(b, c).toString('latin1')
  if (!hole.startsWith('<') || !hole.endsWith('>')) fail('The signature\'s place in the file does not hold a signature: the file was changed after signing.')
  const hex = hole.slice(1, -1).replace(/\s+/g, '')
  if (!/^[0-9a-fA-F]*$/.test(hex) || hex.length % 2 !== 0) fail('The signature is damaged: the file was changed after signing.')
  const raw = Buffer.from(hex, 'hex')
  const outer = readNode(raw)
  return raw.subarray(0, outer.end)
}

interface SignerInfo {
  serial: string | null
  digest: string
  signedAttributes: DerNode | null
  signatureAlgorithm: string
  signature: Buffer
}

function parseSignerInfo(node: DerNode): SignerInfo {
  const parts = children(node)
  const [, sid, digestAlgorithm] = parts
  if (!sid || !isUniversal(digestAlgorithm, TAG.SEQUENCE)) fail('The signature is damaged (signer information unreadable).')
  const serialNode = isUniversal(sid, TAG.SEQUENCE) ? children(sid)[1] : undefined
  const digestOid = oidText(children(digestAlgorithm)[0] ?? fail('The signature is damaged (no digest algorithm).'))
  const digest = DIGESTS[digestOid] ?? fail(`The signature uses a digest this page cannot check (${digestOid}).`)
  let index = 3
  let signedAttributes: DerNode | null = null
  if (isContext(parts[index], 0)) signedAttributes = parts[index++] ?? null
  const algorithm = parts[index++]
  const signature = parts[index]
  if (!isUniversal(algorithm, TAG.SEQUENCE) || !isUniversal(signature, TAG.OCTET_STRING)) fail('The signature is damaged (signature value unreadable).')
  return {
    serial: serialNode && isUniversal(serialNode, TAG.INTEGER) ? integerHex(serialNode) : null,
    digest,
    signedAttributes,
    signatureAlgorithm: oidText(children(algorithm)[0] ?? fail('The signature is damaged (no signature algorithm).')),
    signature: Buffer.from(value(signature)),
  }
}

/** Signed attributes by OID → their first value. */
function attributes(node: DerNode): Map<string, DerNode> {
  const out = new Map<string, DerNode>()
  for (const attribute of children(node)) {
    const [type, values] = children(attribute)
    if (!type || !values) continue
    const first = children(values)[0]
    if (first) out.set(oidText(type), first)
  }
  return out
}

/** The signed attributes as the signature covers them: the same bytes with a SET tag (RFC 5652 §5.4). */
function signedAttributesForVerification(node: DerNode): Buffer {
  const encoded = Buffer.from(bytes(node))
  encoded[0] = 0x31
  return encoded
}

function verifySignatureValue(info: SignerInfo, data: Buffer, certificate: X509Certificate): boolean {
  const key = certificate.publicKey
  if (RSA_SIGNATURES.has(info.signatureAlgorithm)) {
    return verify(info.digest, data, { key, padding: constants.RSA_PKCS1_PADDING }, info.signature)
  }
  if (ECDSA_SIGNATURES.has(info.signatureAlgorithm)) return verify(info.digest, data, key, info.signature)
  fail(`The signature uses a scheme this page cannot check (${info.signatureAlgorithm}).`)
}

function normaliseSerial(serial: string): string {
  return serial.toUpperCase().replace(/^0+/, '')
}

/**
 * Checks the last signature of a PDF.
 *
 * @param pdf - the file's bytes
 * @returns what was found; never throws for a damaged or unsigned file
 */
export function checkPdfSignature(pdf: Buffer): SignatureCheck {
  const result: SignatureCheck = { signed: false, signatureValid: false, coversWholeFile: false, signedAt: null, signer: null, certificateValidAtSigning: null, problem: null }
  const range = findByteRange(pdf)
  if (!range) return { ...result, problem: 'This PDF carries no digital signature, so there is nothing to check.' }
  result.signed = true
  try {
    const [a, b, c, d] = range
    if (a !== 0 || b <= 0 || c <= b || c + d > pdf.length) fail('The signature\'s byte range does not fit this file: the file was changed after signing.')
    result.coversWholeFile = c + d === pdf.length
    const signed = Buffer.concat([pdf.subarray(0, b), pdf.subarray(c, c + d)])

    const contentInfo = readNode(signatureBytes(pdf, range))
    const [contentType, wrapped] = children(contentInfo)
    if (!isUniversal(contentType, TAG.OID) || oidText(contentType) !== OID.signedData || !isContext(wrapped, 0)) fail('The signature is damaged (not a CMS signed-data structure).')
    const signedData = children(wrapped)[0] ?? fail('The signature is damaged (empty signed data).')
    const fields = children(signedData)
    const certificateSet = fields.find(field => isContext(field, 0))
    const signerInfos = fields[fields.length - 1]
    if (!isUniversal(signerInfos, TAG.SET)) fail('The signature is damaged (no signer information).')
    const certificates = certificateSet ? children(certificateSet).filter(node => isUniversal(node, TAG.SEQUENCE)).map(node => new X509Certificate(bytes(node))) : []
    const info = parseSignerInfo(children(signerInfos)[0] ?? fail('The signature is damaged (no signer).'))

    const digest = createHash(info.digest).update(signed).digest()
    let dataToVerify: Buffer = signed
    if (info.signedAttributes) {
      const attrs = attributes(info.signedAttributes)
      const messageDigest = attrs.get(OID.messageDigest)
      const declaredType = attrs.get(OID.contentType)
      const signingTime = attrs.get(OID.signingTime)
      if (signingTime) result.signedAt = timeValue(signingTime)
      if (!messageDigest || !isUniversal(messageDigest, TAG.OCTET_STRING)) fail('The signature is damaged (no message digest).')
      if (declaredType && oidText(declaredType) !== OID.data) fail('The signature does not cover plain document data.')
      if (!value(messageDigest).equals(digest)) {
        // Identify the signer anyway, so the answer can say whose signature no longer matches.
        const candidate = certificates.find(cert => info.serial !== null && normaliseSerial(cert.serialNumber) === normaliseSerial(info.serial)) ?? certificates[0]
        if (candidate) result.signer = signerFacts(candidate)
        fail('The file\'s contents do not match its signature: it was changed after it was signed.')
      }
      dataToVerify = signedAttributesForVerification(info.signedAttributes)
    }

    const bySerial = certificates.filter(cert => info.serial !== null && normaliseSerial(cert.serialNumber) === normaliseSerial(info.serial))
    const candidates = bySerial.length ? bySerial : certificates
    const signer = candidates.find(cert => verifySignatureValue(info, dataToVerify, cert))
    if (!signer) {
      if (candidates[0]) result.signer = signerFacts(candidates[0])
      fail(candidates.length ? 'The signature value does not verify with the signer\'s certificate: the signature was tampered with.' : 'The signature carries no certificate, so the signer cannot be checked.')
    }
    result.signer = signerFacts(signer)
    if (result.signedAt) {
      result.certificateValidAtSigning = result.signedAt >= result.signer.validFrom && result.signedAt <= result.signer.validTo
    }
    if (!result.coversWholeFile) fail('The signature is intact, but bytes were added to the file after it was signed, so the file as a whole is not the signed document.')
    result.signatureValid = true
    return result
  } catch (error) {
    if (error instanceof NotValid) return { ...result, signatureValid: false, problem: error.message }
    // Malformed DER, a certificate node cannot parse, …: the signature is unreadable.
    return { ...result, signatureValid: false, problem: 'The signature is damaged and cannot be read: the file was changed after signing.' }
  }
}
