/**
 * Signing and checking a brief without the server: a generated agency certificate signs a
 * rendered brief (@signpdf), and our JavaScript check (server/brief/verify-signature.ts) agrees
 * with poppler's pdfsig — valid as issued; invalid after one changed byte in the signed range,
 * one changed byte in the signature, or bytes appended after signing. Certificates: generated
 * ones open with the storage passphrase; uploads are refused with a reason when they cannot sign.
 */
import { spawnSync } from 'node:child_process'
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import forge from 'node-forge'
import { beforeAll, describe, expect, it } from 'vitest'
import { assembleBriefData } from '../../../server/brief/assemble'
import { children, integerHex, oidText, readNode, timeValue } from '../../../server/brief/der'
import { buildBriefDocument } from '../../../server/brief/document'
import { renderPdf } from '../../../server/brief/render'
import { verifyMessage } from '../../../server/brief/verify-message'
import { checkPdfSignature, findByteRange } from '../../../server/brief/verify-signature'
import { CertificateProblem, DEFAULT_SIGNING_PASSPHRASE, generateAgencyCertificate, openSigningPkcs12, rewrapForStorage, signingPassphrase } from '../../../server/utils/certificates'
import { signPdf } from '../../../server/utils/signing'
import { demoBriefRecords, testFonts } from './demo-records'

function pdfsig(pdf: Buffer): string {
  const directory = mkdtempSync(join(tmpdir(), 'brief-sig-'))
  const path = join(directory, 'brief.pdf')
  writeFileSync(path, pdf)
  try {
    const run = spawnSync('pdfsig', [path], { encoding: 'utf8' })
    return `${run.stdout}${run.stderr}`
  } finally {
    rmSync(directory, { recursive: true, force: true })
  }
}

const agency = { name: 'Eastern Uplands Wildlife Service', contactEmail: 'conservation@demo.tributary.test' }
const signingTime = new Date('2026-03-14T15:30:00Z')
let credential: ReturnType<typeof generateAgencyCertificate>
let signed: Buffer

beforeAll(async () => {
  credential = generateAgencyCertificate(agency, 'storage-passphrase', new Date('2026-01-01T00:00:00Z'))
  const data = assembleBriefData(demoBriefRecords())
  const unsigned = await renderPdf(buildBriefDocument(data, { draft: false }), await testFonts(), { reason: 'Approval', name: agency.name, location: 'Ridgeford', contactInfo: agency.contactEmail, signingTime })
  signed = (await signPdf(unsigned, credential.pkcs12, 'storage-passphrase', signingTime)).pdf
}, 60_000)

describe('a signed brief', () => {
  it('is valid for pdfsig and for our check, which name the same signer and time', () => {
    expect(pdfsig(signed)).toMatch(/Signature is Valid/)
    const check = checkPdfSignature(signed)
    expect(check).toMatchObject({ signed: true, signatureValid: true, coversWholeFile: true, problem: null, certificateValidAtSigning: true })
    expect(check.signedAt?.toISOString()).toBe('2026-03-14T15:30:00.000Z')
    expect(check.signer).toMatchObject({ commonName: agency.name, selfSigned: true, fingerprintSha256: credential.info.fingerprintSha256 })
  })

  it('one changed byte in the signed range: the digest no longer matches', () => {
    const [, b] = findByteRange(signed) ?? [0, 0, 0, 0]
    for (const at of [10, Math.floor(b / 2), signed.length - 10]) {
      const changed = Buffer.from(signed)
      changed[at] = (changed[at] ?? 0) ^ 0x20
      const check = checkPdfSignature(changed)
      expect(check.signatureValid, `byte ${at}`).toBe(false)
      expect(check.problem).toMatch(/changed/)
      expect(pdfsig(changed)).not.toMatch(/Signature is Valid/)
    }
  })

  it('one changed hex digit in the signature value: invalid', () => {
    const [, b] = findByteRange(signed) ?? [0, 0, 0, 0]
    // The signature value sits near the end of the DER; flip a digit well inside it.
    const hex = signed.subarray(b + 1, signed.indexOf('>', b)).toString('latin1')
    const lastNonZero = hex.replace(/0+$/, '').length
    const at = b + 1 + lastNonZero - 40
    const changed = Buffer.from(signed)
    changed[at] = changed[at] === 0x61 ? 0x62 : 0x61
    expect(checkPdfSignature(changed).signatureValid).toBe(false)
  })

  it('bytes appended after signing: the signature no longer covers the file', () => {
    const check = checkPdfSignature(Buffer.concat([signed, Buffer.from('\n%%EOF\n')]))
    expect(check).toMatchObject({ signed: true, signatureValid: false, coversWholeFile: false })
    expect(check.problem).toMatch(/added to the file after it was signed/)
  })

  it('an unsigned PDF and a damaged byte range are reported, not thrown', () => {
    expect(checkPdfSignature(Buffer.from('%PDF-1.7\n%%EOF'))).toMatchObject({ signed: false, signatureValid: false })
    const text = signed.toString('latin1').replace(/\/ByteRange \[0 (\d+)/, (_m, b: string) => `/ByteRange [0 ${String(Number(b) + 1).padStart(b.length, '0')}`)
    expect(checkPdfSignature(Buffer.from(text, 'latin1')).signatureValid).toBe(false)
  })

  it('the answer in words says valid and issued, valid elsewhere, or not valid', () => {
    const check = checkPdfSignature(signed)
    expect(verifyMessage(check, { documentId: 'd-1', proposalTitle: 'T', agency: 'A' })).toMatch(/^Valid\. .*document d-1 .*self-signed/)
    expect(verifyMessage(check, null)).toMatch(/does not match any brief issued by this Tributary server/)
    expect(verifyMessage({ ...check, signatureValid: false, problem: 'Changed.' }, null)).toMatch(/^Not valid \(signed by Eastern Uplands Wildlife Service\)\. Changed\./)
  })
})

describe('the DER reader', () => {
  it('reads OIDs, integers, times and nested elements', () => {
    expect(oidText(readNode(Buffer.from('06092a864886f70d010702', 'hex')))).toBe('1.2.840.113549.1.7.2')
    expect(integerHex(readNode(Buffer.from('0203008fff', 'hex')))).toBe('8FFF')
    expect(timeValue(readNode(Buffer.from(`170d${Buffer.from('260314153000Z').toString('hex')}`, 'hex')))?.toISOString()).toBe('2026-03-14T15:30:00.000Z')
    const sequence = readNode(Buffer.from('3006020101020102', 'hex'))
    expect(children(sequence).map(integerHex)).toEqual(['01', '02'])
    expect(() => readNode(Buffer.from('3010020101', 'hex'))).toThrow(/DER/)
  })
})

describe('agency certificates', () => {
  it('a generated certificate is self-signed, valid for five years and opens with its passphrase', () => {
    expect(credential.info).toMatchObject({ commonName: agency.name, selfSigned: true })
    expect(credential.info.notAfter.getUTCFullYear()).toBe(2031)
    expect(openSigningPkcs12(credential.pkcs12, 'storage-passphrase', new Date('2026-06-01')).info.fingerprintSha256).toBe(credential.info.fingerprintSha256)
  })

  it('refuses a wrong passphrase, a file that is not PKCS#12, and an expired certificate — with a reason', () => {
    expect(() => openSigningPkcs12(credential.pkcs12, 'wrong', new Date('2026-06-01'))).toThrow(CertificateProblem)
    expect(() => openSigningPkcs12(Buffer.from('not a certificate'), '')).toThrow(/not a readable PKCS#12/)
    expect(() => openSigningPkcs12(credential.pkcs12, 'storage-passphrase', new Date('2032-01-01'))).toThrow(/expired on 2031/)
    expect(() => openSigningPkcs12(credential.pkcs12, 'storage-passphrase', new Date('2025-01-01'))).toThrow(/not valid before/)
  })

  it('an upload is re-encrypted under the storage passphrase and still signs', async () => {
    const opened = openSigningPkcs12(credential.pkcs12, 'storage-passphrase', new Date('2026-06-01'))
    const stored = rewrapForStorage(opened, 'server-passphrase')
    expect(() => openSigningPkcs12(stored, 'storage-passphrase', new Date('2026-06-01'))).toThrow(CertificateProblem)
    const asn1 = forge.asn1.fromDer(forge.util.createBuffer(stored.toString('binary')))
    expect(forge.pkcs12.pkcs12FromAsn1(asn1, false, 'server-passphrase').getBags({ bagType: forge.pki.oids.certBag ?? '' })).toBeTruthy()
  })

  it('the storage passphrase comes from NUXT_SIGNING_PASSPHRASE, else the documented demo default', () => {
    expect(signingPassphrase({ NUXT_SIGNING_PASSPHRASE: '  my-secret  ' })).toBe('my-secret')
    expect(signingPassphrase({})).toBe(DEFAULT_SIGNING_PASSPHRASE)
    expect(signingPassphrase({ NUXT_SIGNING_PASSPHRASE: '' })).toBe(DEFAULT_SIGNING_PASSPHRASE)
  })
})
