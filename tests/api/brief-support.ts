/**
 * Helpers for the brief and verify API tests: raw PDF downloads with the client's session,
 * poppler's command-line tools (pdfsig, pdftotext, pdfinfo; installed by scripts/test.sh) on a
 * temporary copy, multipart uploads, and a PKCS#12 made on the spot with node-forge.
 */
import { execFileSync, spawnSync } from 'node:child_process'
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { crc32, deflateSync } from 'node:zlib'
import forge from 'node-forge'
import type { ApiClient, ApiResponse } from '../support/client'

/** GET `path` with the client's cookies; the body as bytes. */
export async function getBytes(client: ApiClient, path: string): Promise<{ status: number, headers: Headers, bytes: Buffer }> {
  const response = await fetch(new URL(path, client.baseUrl), { headers: client.hasSession ? { cookie: client.cookieHeader } : {} })
  return { status: response.status, headers: response.headers, bytes: Buffer.from(await response.arrayBuffer()) }
}

/** Runs `fn` with the bytes written to a temporary file. */
function withFile<T>(bytes: Buffer, fn: (path: string) => T): T {
  const directory = mkdtempSync(join(tmpdir(), 'brief-test-'))
  const path = join(directory, 'file.pdf')
  writeFileSync(path, bytes)
  try {
    return fn(path)
  } finally {
    rmSync(directory, { recursive: true, force: true })
  }
}

/** pdfsig's report (stdout + stderr; pdfsig exits non-zero for unsigned or invalid files). */
export function pdfsig(bytes: Buffer): string {
  return withFile(bytes, (path) => {
    const run = spawnSync('pdfsig', [path], { encoding: 'utf8' })
    return `${run.stdout}\n${run.stderr}`
  })
}

/** The text of the PDF (all pages, or one page, 1-based). */
export function pdftotext(bytes: Buffer, page?: number): string {
  return withFile(bytes, path => execFileSync('pdftotext', [...(page ? ['-f', String(page), '-l', String(page)] : []), '-layout', path, '-'], { encoding: 'utf8' }))
}

/** Number of pages (pdfinfo). */
export function pageCount(bytes: Buffer): number {
  return withFile(bytes, (path) => {
    const info = execFileSync('pdfinfo', [path], { encoding: 'utf8' })
    return Number(/Pages:\s+(\d+)/.exec(info)?.[1] ?? 0)
  })
}

/**
 * POSTs a multipart form with one file (and text fields). A network error (not an HTTP
 * answer) is retried once: after a slow step in the test, fetch may reuse a kept-alive
 * connection the server has just closed (EPIPE / ECONNRESET), which says nothing about the route.
 */
export async function postFile(client: ApiClient, path: string, file: { name: string, type: string, bytes: Buffer }, fields: Record<string, string> = {}): Promise<ApiResponse> {
  const send = () => {
    const form = new FormData()
    for (const [name, value] of Object.entries(fields)) form.append(name, value)
    form.append('file', new Blob([new Uint8Array(file.bytes)], { type: file.type }), file.name)
    return client.request('POST', path, form)
  }
  try {
    return await send()
  } catch (error) {
    if (!(error instanceof TypeError)) throw error // fetch reports network failures as TypeError
    return send()
  }
}

/**
 * A PKCS#12 with a fresh RSA key and a self-signed certificate.
 *
 * @param commonName - the certificate's CN
 * @param passphrase - encrypts the file
 * @param validity - from / to (default: from yesterday for two years)
 */
export function makePkcs12(commonName: string, passphrase: string, validity: { from?: Date, to?: Date } = {}, options: { withKey?: boolean } = {}): Buffer {
  const keys = forge.pki.rsa.generateKeyPair({ bits: 2048 })
  const certificate = forge.pki.createCertificate()
  certificate.publicKey = keys.publicKey
  certificate.serialNumber = '0a1b2c3d'
  certificate.validity.notBefore = validity.from ?? new Date(Date.now() - 86_400_000)
  certificate.validity.notAfter = validity.to ?? new Date(Date.now() + 2 * 365 * 86_400_000)
  const attributes = [{ name: 'commonName', value: commonName }, { name: 'organizationName', value: 'Test signing office (invented)' }]
  certificate.setSubject(attributes)
  certificate.setIssuer(attributes)
  certificate.sign(keys.privateKey, forge.md.sha256.create())
  const asn1 = options.withKey === false
    ? forge.pkcs12.toPkcs12Asn1(null, [certificate], passphrase, { algorithm: '3des' })
    : forge.pkcs12.toPkcs12Asn1(keys.privateKey, [certificate], passphrase, { algorithm: '3des' })
  return Buffer.from(forge.asn1.toDer(asn1).getBytes(), 'binary')
}

function chunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4)
  length.writeUInt32BE(data.length)
  const body = Buffer.concat([Buffer.from(type, 'latin1'), data])
  const crc = Buffer.alloc(4)
  crc.writeUInt32BE(crc32(body))
  return Buffer.concat([length, body, crc])
}

/**
 * A small logo as a real PNG (RGB, 8 bit): a river-teal field with an ochre band, the shape of a
 * letterhead mark. `padding` adds a text chunk of that many bytes (to make oversized files).
 */
export function makeLogoPng(width = 96, height = 48, padding = 0): Buffer {
  const header = Buffer.alloc(13)
  header.writeUInt32BE(width, 0)
  header.writeUInt32BE(height, 4)
  header[8] = 8 // bit depth
  header[9] = 2 // colour type RGB
  const rows: Buffer[] = []
  for (let y = 0; y < height; y++) {
    const row = Buffer.alloc(1 + width * 3)
    for (let x = 0; x < width; x++) {
      const band = y > height * 0.62 && y < height * 0.78
      const colour = band ? [0xD3, 0x8C, 0x20] : [0x19, 0x4C, 0x4E]
      row.set(colour, 1 + x * 3)
    }
    rows.push(row)
  }
  const parts = [Buffer.from([0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A]), chunk('IHDR', header), chunk('IDAT', deflateSync(Buffer.concat(rows)))]
  if (padding > 0) parts.push(chunk('tEXt', Buffer.concat([Buffer.from('Comment\0', 'latin1'), Buffer.alloc(padding, 0x41)])))
  parts.push(chunk('IEND', Buffer.alloc(0)))
  return Buffer.concat(parts)
}
