/**
 * The agency's signing credential: a private key and its X.509 certificate in a PKCS#12 file.
 *
 * - `generateAgencyCertificate` makes a self-signed certificate for an agency (the local demo
 *   gets one at set-up; an agency that approves before it has one gets one then). Readers show
 *   such a signature as valid with an unknown issuer — honest: no outside authority vouches
 *   for the name.
 * - `openSigningPkcs12` checks an administrator's upload: it opens with the passphrase, holds
 *   an RSA private key (what @signpdf/signer-p12 signs with) and the certificate that matches
 *   it, and the certificate is valid now.
 * - Stored encrypted: the credential is re-wrapped under the server's signing passphrase
 *   (env NUXT_SIGNING_PASSPHRASE) before it goes into `agency_signing_certificates`; the
 *   uploaded file's own passphrase is never stored. Without the environment variable the
 *   documented local-demo passphrase is used (README: Settings) — set your own in production.
 *
 * Plain Node (node-forge, node:crypto), no Nitro globals, so the seed can use it too.
 */
import { createHash, randomBytes, X509Certificate } from 'node:crypto'
import forge from 'node-forge'
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize'

/** Used when NUXT_SIGNING_PASSPHRASE is not set: fine for the local demo, never for production. */
export const DEFAULT_SIGNING_PASSPHRASE = 'tributary-local-demo-signing-passphrase'

/** Years a generated certificate is valid. */
export const GENERATED_CERTIFICATE_YEARS = 5

/** The passphrase that protects stored credentials (NUXT_SIGNING_PASSPHRASE, else the demo default). */
export function signingPassphrase(env: NodeJS.ProcessEnv = process.env): string {
  const value = env.NUXT_SIGNING_PASSPHRASE?.trim()
  return value ? value : DEFAULT_SIGNING_PASSPHRASE
}

/** What people see about a certificate. */
export interface CertificateInfo {
  /** 'CN=Eastern Uplands Wildlife Service, O=Eastern Uplands Wildlife Service, OU=Brief signing' */
  subject: string
  commonName: string
  issuer: string
  /** Upper-case hex. */
  serialNumber: string
  notBefore: Date
  notAfter: Date
  /** SHA-256 of the DER certificate, lower-case hex. */
  fingerprintSha256: string
  selfSigned: boolean
}

/** A problem with an uploaded PKCS#12, in words for the administrator (the route answers 422). */
export class CertificateProblem extends Error {
  override name = 'CertificateProblem'
}

const SHORT_NAMES: Record<string, string> = { commonName: 'CN', organizationName: 'O', organizationalUnitName: 'OU', countryName: 'C', localityName: 'L', stateOrProvinceName: 'ST', emailAddress: 'E' }

function distinguishedName(attributes: forge.pki.CertificateField[]): string {
  return attributes
    .map(attribute => `${attribute.shortName ?? (attribute.name ? SHORT_NAMES[attribute.name] : undefined) ?? attribute.type}=${String(attribute.value)}`)
    .join(', ')
}

/**
 * The facts shown for a certificate.
 *
 * @param certificate - a node-forge certificate
 */
export function describeCertificate(certificate: forge.pki.Certificate): CertificateInfo {
  const der = Buffer.from(forge.asn1.toDer(forge.pki.certificateToAsn1(certificate)).getBytes(), 'binary')
  const x509 = new X509Certificate(der)
  const subject = distinguishedName(certificate.subject.attributes)
  const issuer = distinguishedName(certificate.issuer.attributes)
  return {
    subject,
    commonName: String(certificate.subject.getField('CN')?.value ?? subject),
    issuer,
    serialNumber: x509.serialNumber.toUpperCase(),
    notBefore: certificate.validity.notBefore,
    notAfter: certificate.validity.notAfter,
    fingerprintSha256: createHash('sha256').update(der).digest('hex'),
    selfSigned: subject === issuer && x509.verify(x509.publicKey),
  }
}

/** PKCS#12 bytes holding `key` and `certificates`, encrypted with `passphrase` (AES-256). */
function toPkcs12(key: forge.pki.rsa.PrivateKey, certificates: forge.pki.Certificate[], passphrase: string): Buffer {
  const asn1 = forge.pkcs12.toPkcs12Asn1(key, certificates, passphrase, { algorithm: 'aes256', count: 10_000, friendlyName: 'Tributary brief signing' })
  return Buffer.from(forge.asn1.toDer(asn1).getBytes(), 'binary')
}

export interface GeneratedCertificate {
  /** PKCS#12, encrypted with the passphrase given. */
  pkcs12: Buffer
  info: CertificateInfo
}

/**
 * A new RSA-2048 key and a self-signed certificate for an agency, valid from now for
 * GENERATED_CERTIFICATE_YEARS years, for signing documents (key usage: digital signature,
 * non-repudiation).
 *
 * @param agency.name - becomes the common name and the organisation
 * @param agency.contactEmail - added as e-mail address when present
 * @param passphrase - encrypts the PKCS#12 (normally `signingPassphrase()`)
 * @param now - start of validity (default: the current time)
 */
export function generateAgencyCertificate(agency: { name: string, contactEmail?: string | null }, passphrase: string, now: Date = new Date()): GeneratedCertificate {
  const keys = forge.pki.rsa.generateKeyPair({ bits: 2048, e: 0x10001 })
  const certificate = forge.pki.createCertificate()
  certificate.publicKey = keys.publicKey
  const serial = randomBytes(16)
  serial[0] = (serial[0] ?? 0) & 0x7F // positive INTEGER
  certificate.serialNumber = serial.toString('hex')
  certificate.validity.notBefore = new Date(now.getTime() - 60_000)
  const notAfter = new Date(now.getTime())
  notAfter.setUTCFullYear(notAfter.getUTCFullYear() + GENERATED_CERTIFICATE_YEARS)
  certificate.validity.notAfter = notAfter
  const attributes: forge.pki.CertificateField[] = [
    { name: 'commonName', value: agency.name.slice(0, 64) },
    { name: 'organizationName', value: agency.name.slice(0, 64) },
    { name: 'organizationalUnitName', value: 'Brief signing (Tributary)' },
  ]
  if (agency.contactEmail) attributes.push({ name: 'emailAddress', value: agency.contactEmail })
  certificate.setSubject(attributes)
  certificate.setIssuer(attributes)
  certificate.setExtensions([
    { name: 'basicConstraints', cA: false },
    { name: 'keyUsage', digitalSignature: true, nonRepudiation: true },
    { name: 'subjectKeyIdentifier' },
  ])
  certificate.sign(keys.privateKey, forge.md.sha256.create())
  return { pkcs12: toPkcs12(keys.privateKey, [certificate], passphrase), info: describeCertificate(certificate) }
}

/** An opened credential. */
export interface OpenedCredential {
  key: forge.pki.rsa.PrivateKey
  certificate: forge.pki.Certificate
  /** Other certificates in the file (issuers), in file order. */
  chain: forge.pki.Certificate[]
  info: CertificateInfo
}

/**
 * Opens a PKCS#12 and checks that it can sign briefs.
 *
 * @param pkcs12 - the file's bytes
 * @param passphrase - its passphrase ('' for none)
 * @param now - the time validity is checked at (default now)
 * @returns the key, the matching certificate, the rest of the chain and the certificate facts
 * @throws CertificateProblem with a sentence for the administrator
 */
export function openSigningPkcs12(pkcs12: Buffer, passphrase: string, now: Date = new Date()): OpenedCredential {
  let p12: forge.pkcs12.Pkcs12Pfx
  try {
    const asn1 = forge.asn1.fromDer(forge.util.createBuffer(pkcs12.toString('binary')))
    p12 = forge.pkcs12.pkcs12FromAsn1(asn1, false, passphrase)
  } catch (error) {
    const detail = error instanceof Error ? error.message : ''
    if (/mac|password|decrypt|invalid/i.test(detail)) throw new CertificateProblem('The file could not be opened with this passphrase. Check the passphrase and try again.')
    throw new CertificateProblem('The file is not a readable PKCS#12 (.p12 / .pfx) file.')
  }
  const keyBags = [
    ...(p12.getBags({ bagType: forge.pki.oids.pkcs8ShroudedKeyBag ?? '' })[forge.pki.oids.pkcs8ShroudedKeyBag ?? ''] ?? []),
    ...(p12.getBags({ bagType: forge.pki.oids.keyBag ?? '' })[forge.pki.oids.keyBag ?? ''] ?? []),
  ]
  const key = keyBags.find(bag => bag.key)?.key as forge.pki.rsa.PrivateKey | undefined
  if (!key) throw new CertificateProblem('The file holds no private key, so it cannot sign. Export the certificate together with its private key.')
  if (!('n' in key) || !('e' in key)) throw new CertificateProblem('Only RSA keys can sign briefs; this file holds another kind of key.')
  const certificates = (p12.getBags({ bagType: forge.pki.oids.certBag ?? '' })[forge.pki.oids.certBag ?? ''] ?? [])
    .map(bag => bag.cert)
    .filter((cert): cert is forge.pki.Certificate => Boolean(cert))
  const certificate = certificates.find((cert) => {
    const publicKey = cert.publicKey as forge.pki.rsa.PublicKey
    return publicKey.n?.compareTo(key.n) === 0 && publicKey.e?.compareTo(key.e) === 0
  })
  if (!certificate) throw new CertificateProblem('The file holds no certificate for its private key.')
  if (certificate.validity.notAfter.getTime() <= now.getTime()) {
    throw new CertificateProblem(`The certificate expired on ${certificate.validity.notAfter.toISOString().slice(0, 10)}; upload a current one.`)
  }
  if (certificate.validity.notBefore.getTime() > now.getTime()) {
    throw new CertificateProblem(`The certificate is not valid before ${certificate.validity.notBefore.toISOString().slice(0, 10)}.`)
  }
  return { key, certificate, chain: certificates.filter(cert => cert !== certificate), info: describeCertificate(certificate) }
}

/**
 * The credential re-encrypted for storage under `storagePassphrase`, key and matching
 * certificate first (so the signer picks the right one), then the rest of the chain.
 */
export function rewrapForStorage(credential: OpenedCredential, storagePassphrase: string): Buffer {
  return toPkcs12(credential.key, [credential.certificate, ...credential.chain], storagePassphrase)
}

/** One stored credential (table agency_signing_certificates). */
export interface StoredCredential {
  agencyId: number
  pkcs12: Buffer
  info: CertificateInfo
  origin: 'generated' | 'uploaded'
  uploadedBy: number | null
  updatedAt: Date
}

interface CredentialRow {
  agency_id: number
  pkcs12: Buffer
  subject: string
  issuer: string
  serial_number: string
  fingerprint_sha256: string
  not_before: Date
  not_after: Date
  origin: 'generated' | 'uploaded'
  uploaded_by: number | null
  updated_at: Date
}

/**
 * The agency's stored credential, or null.
 *
 * @param sequelize - connection (from useDb() in the server, or a seed's)
 * @param agencyId - the agency
 * @param transaction - optional transaction to read in
 */
export async function loadAgencyCredential(sequelize: Sequelize, agencyId: number, transaction?: Transaction): Promise<StoredCredential | null> {
  const rows = await sequelize.query<CredentialRow>(
    'SELECT * FROM agency_signing_certificates WHERE agency_id = :agencyId',
    { replacements: { agencyId }, type: QueryTypes.SELECT, transaction },
  )
  const row = rows[0]
  if (!row) return null
  const subject = row.subject
  return {
    agencyId: row.agency_id,
    pkcs12: row.pkcs12,
    info: {
      subject,
      commonName: /(?:^|, )CN=([^,]+)/.exec(subject)?.[1] ?? subject,
      issuer: row.issuer,
      serialNumber: row.serial_number,
      notBefore: new Date(row.not_before),
      notAfter: new Date(row.not_after),
      fingerprintSha256: row.fingerprint_sha256,
      selfSigned: row.subject === row.issuer,
    },
    origin: row.origin,
    uploadedBy: row.uploaded_by,
    updatedAt: new Date(row.updated_at),
  }
}

/**
 * Stores (or replaces) the agency's credential. `pkcs12` must already be encrypted under the
 * storage passphrase.
 */
export async function saveAgencyCredential(sequelize: Sequelize, credential: { agencyId: number, pkcs12: Buffer, info: CertificateInfo, origin: 'generated' | 'uploaded', uploadedBy: number | null }, transaction?: Transaction): Promise<void> {
  const { info } = credential
  await sequelize.query(
    `INSERT INTO agency_signing_certificates
       (agency_id, pkcs12, subject, issuer, serial_number, fingerprint_sha256, not_before, not_after, origin, uploaded_by)
     VALUES (:agencyId, :pkcs12, :subject, :issuer, :serialNumber, :fingerprint, :notBefore, :notAfter, :origin, :uploadedBy)
     ON CONFLICT (agency_id) DO UPDATE SET
       pkcs12 = EXCLUDED.pkcs12, subject = EXCLUDED.subject, issuer = EXCLUDED.issuer,
       serial_number = EXCLUDED.serial_number, fingerprint_sha256 = EXCLUDED.fingerprint_sha256,
       not_before = EXCLUDED.not_before, not_after = EXCLUDED.not_after, origin = EXCLUDED.origin,
       uploaded_by = EXCLUDED.uploaded_by, updated_at = now(),
       version = agency_signing_certificates.version + 1`,
    {
      replacements: {
        agencyId: credential.agencyId,
        pkcs12: credential.pkcs12,
        subject: info.subject,
        issuer: info.issuer,
        serialNumber: info.serialNumber,
        fingerprint: info.fingerprintSha256,
        notBefore: info.notBefore,
        notAfter: info.notAfter,
        origin: credential.origin,
        uploadedBy: credential.uploadedBy,
      },
      transaction,
    },
  )
}

/**
 * The agency's credential, generating and storing a self-signed one when it has none.
 *
 * @returns the credential and whether it was made just now
 */
export async function ensureAgencyCredential(sequelize: Sequelize, agency: { id: number, name: string, contactEmail?: string | null }, transaction?: Transaction, env: NodeJS.ProcessEnv = process.env): Promise<{ credential: StoredCredential, generated: boolean }> {
  const existing = await loadAgencyCredential(sequelize, agency.id, transaction)
  if (existing) return { credential: existing, generated: false }
  const made = generateAgencyCertificate(agency, signingPassphrase(env))
  await saveAgencyCredential(sequelize, { agencyId: agency.id, pkcs12: made.pkcs12, info: made.info, origin: 'generated', uploadedBy: null }, transaction)
  const stored = await loadAgencyCredential(sequelize, agency.id, transaction)
  if (!stored) throw new Error('The signing certificate could not be stored.')
  return { credential: stored, generated: true }
}
