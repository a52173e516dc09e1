/**
 * Helpers for the genotype, F_ST and attachment API tests: multipart uploads (as a browser form
 * would send them, or as a hand-made stream for very large bodies), the demo records' ids, a
 * second biologist in the demo agency, and a direct look into the test's object store.
 */
import { readFileSync } from 'node:fs'
import { ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3'
import { parseGenotypeCsv, type GenotypeDataset } from '../../shared/genetics/index'
import { hashPasswordScrypt } from '../../server/db/password'
import type { ApiClient, ApiResponse } from '../support/client'
import { demoPassword, type TestServer } from '../support/server'

/** Sends `file` (and text fields) as multipart/form-data, like an HTML form. */
export function uploadForm(client: ApiClient, path: string, file: { name: string, content: string | Uint8Array, type?: string }, fields: Record<string, string> = {}): Promise<ApiResponse> {
  const form = new FormData()
  for (const [name, value] of Object.entries(fields)) form.append(name, value)
  const bytes = typeof file.content === 'string' ? new TextEncoder().encode(file.content) : file.content
  form.append('file', new Blob([new Uint8Array(bytes)], { type: file.type ?? 'application/octet-stream' }), file.name)
  return client.post(path, form)
}

/**
 * Streams a multipart body of `totalBytes` file bytes without ever holding it (chunked, no
 * Content-Length), and returns the status and the JSON answer.
 */
export async function streamLargeUpload(server: TestServer, client: ApiClient, path: string, fileName: string, totalBytes: number): Promise<{ status: number, body: { message?: string }, elapsedMs: number }> {
  const boundary = '----tributary-test-boundary'
  const head = new TextEncoder().encode(`--${boundary}\r\nContent-Disposition: form-data; name="markerType"\r\n\r\nmicrosatellite\r\n--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${fileName}"\r\nContent-Type: text/csv\r\n\r\n`)
  const tail = new TextEncoder().encode(`\r\n--${boundary}--\r\n`)
  const chunk = new TextEncoder().encode('id,L_1,L_2\n'.padEnd(64 * 1024, 'x'))
  let sent = 0
  let stage: 'head' | 'body' | 'tail' | 'done' = 'head'
  const body = new ReadableStream<Uint8Array>({
    pull(controller) {
      if (stage === 'head') {
        controller.enqueue(head)
        stage = 'body'
      } else if (stage === 'body') {
        controller.enqueue(chunk)
        sent += chunk.length
        if (sent >= totalBytes) stage = 'tail'
      } else if (stage === 'tail') {
        controller.enqueue(tail)
        stage = 'done'
      } else {
        controller.close()
      }
    },
  })
  const started = Date.now()
  const response = await fetch(new URL(path, server.url), {
    method: 'POST',
    body,
    duplex: 'half',
    headers: { 'content-type': `multipart/form-data; boundary=${boundary}`, 'cookie': client.cookieHeader },
  } as RequestInit & { duplex: 'half' })
  const text = await response.text()
  let parsed: { message?: string } = {}
  try {
    parsed = JSON.parse(text) as { message?: string }
  } catch { /* not JSON */ }
  return { status: response.status, body: parsed, elapsedMs: Date.now() - started }
}

/** Ids of the demo species and its subpopulations, by name. */
export async function demoRecords(server: TestServer): Promise<{ speciesId: number, agencyId: number, subpopulations: Record<string, number> }> {
  const rows = await server.db.query<{ id: number, name: string, species_id: number, agency_id: number }>(
    `SELECT s.id, s.name, s.species_id, s.agency_id FROM subpopulations s JOIN agencies a ON a.id = s.agency_id
     WHERE a.name = 'Eastern Uplands Wildlife Service' ORDER BY s.id`,
  )
  const first = rows.rows[0]
  if (!first) throw new Error('no demo subpopulations')
  return {
    speciesId: first.species_id,
    agencyId: first.agency_id,
    subpopulations: Object.fromEntries(rows.rows.map(row => [row.name, row.id])),
  }
}

/** Adds a second biologist to the demo agency (demo password) and returns the address. */
export async function addSecondBiologist(server: TestServer, agencyId: number): Promise<string> {
  const email = 'second.biologist@demo.tributary.test'
  await server.db.query(
    `INSERT INTO users (agency_id, email, name, role, password_hash, active) VALUES ($1, $2, 'Jordan Vale', 'biologist', $3, true)`,
    [agencyId, email, await hashPasswordScrypt(demoPassword)],
  )
  return email
}

/** Keys in the test's private object store. */
export async function storedKeys(server: TestServer): Promise<string[]> {
  const client = new S3Client({
    endpoint: server.objectStore.endpoint, region: 'us-east-1', forcePathStyle: true,
    credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
    requestChecksumCalculation: 'WHEN_REQUIRED', responseChecksumValidation: 'WHEN_REQUIRED',
  })
  const keys: string[] = []
  let token: string | undefined
  do {
    const page = await client.send(new ListObjectsV2Command({ Bucket: server.objectStore.bucket, ContinuationToken: token }))
    for (const entry of page.Contents ?? []) if (entry.Key) keys.push(entry.Key)
    token = page.IsTruncated ? page.NextContinuationToken : undefined
  } while (token)
  client.destroy()
  return keys
}

/** A committed demo genotype file, as text and parsed by the engine. */
export function demoGenotypeFile(file: string): { text: string, dataset: GenotypeDataset } {
  const text = readFileSync(new URL(`../../seeds/demo/genotypes/${file}`, import.meta.url), 'utf8')
  const parsed = parseGenotypeCsv(text)
  if (!('dataset' in parsed)) throw new Error(`${file} does not parse`)
  return { text, dataset: parsed.dataset }
}

/** The demo manifest: file → subpopulation name. */
export function demoManifest(): { file: string, subpopulation: string, sampledYear: number }[] {
  const manifest = JSON.parse(readFileSync(new URL('../../seeds/demo/genotypes/manifest.json', import.meta.url), 'utf8')) as { datasets: { file: string, subpopulation: string, sampledYear: number }[] }
  return manifest.datasets
}

/** The worked example of SCIENCE.md §8.2 (invented), population "Alder Hollow", as CSV. */
export const ALDER_HOLLOW_CSV = [
  'id,Loc1_1,Loc1_2,Loc2_1,Loc2_2,Loc3_1,Loc3_2',
  'AH1,101,103,200,200,150,154',
  'AH2,101,101,200,210,150,150',
  'AH3,103,105,200,200,154,158',
  'AH4,101,103,210,210,150,154',
  'AH5,101,101,200,210,150,158',
  'AH6,103,103,200,200,154,154',
  '',
].join('\n')

/** A small VCF of biallelic SNPs (invented samples). */
export const SMALL_VCF = [
  '##fileformat=VCFv4.2',
  '##source=invented test data',
  '#CHROM\tPOS\tID\tREF\tALT\tQUAL\tFILTER\tINFO\tFORMAT\tS1\tS2\tS3\tS4',
  '1\t100\tsnp1\tA\tG\t.\tPASS\t.\tGT\t0/1\t0/0\t1/1\t0/1',
  '1\t200\tsnp2\tC\tT\t.\tPASS\t.\tGT\t0/0\t0/1\t./.\t0|1',
  '2\t300\tsnp3\tG\tA\t.\tPASS\t.\tGT\t1/1\t1/1\t0/1\t0/0',
  '',
].join('\n')
