/**
 * Fault: the object store is down when someone uploads. An attachment and a genotype table are
 * each refused with a 503 that says nothing was saved; afterwards there is no database record,
 * no audit event and no object (whole or partial) in the bucket. With the store back, the very
 * same uploads succeed and their objects hold exactly the bytes sent. A store that goes away in
 * the middle of a large (multipart) upload leaves nothing behind either.
 */
import { createHash } from 'node:crypto'
import { GetObjectCommand, S3Client } from '@aws-sdk/client-s3'
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { expectErrorAnswer } from './auth-support'
import { ALDER_HOLLOW_CSV, demoRecords, storedKeys, uploadForm } from './genotypes-support'

const server = useServer()
let biologist: ApiClient
let subpopulations: Record<string, number>

const PDF = new TextEncoder().encode('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n')
const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex')

beforeAll(async () => {
  subpopulations = (await demoRecords(server)).subpopulations
  biologist = await server.signIn(demo.biologist)
})

/** Row counts that an upload changes. */
async function uploadFootprint() {
  const result = await server.db.query<{ attachments: number, datasets: number, audits: number }>(`
    SELECT (SELECT count(*) FROM attachments)::int AS attachments,
           (SELECT count(*) FROM genetic_datasets)::int AS datasets,
           (SELECT count(*) FROM audit_events)::int AS audits`)
  return result.rows[0]!
}

async function storedBytes(key: string): Promise<Buffer> {
  const client = new S3Client({
    endpoint: server.objectStore.endpoint, region: 'us-east-1', forcePathStyle: true,
    credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
    requestChecksumCalculation: 'WHEN_REQUIRED', responseChecksumValidation: 'WHEN_REQUIRED',
  })
  try {
    const answer = await client.send(new GetObjectCommand({ Bucket: server.objectStore.bucket, Key: key }))
    return Buffer.from(await answer.Body!.transformToByteArray())
  } finally {
    client.destroy()
  }
}

describe('object storage down during uploads', () => {
  it('refuses with a clear 503, leaves no record and no object; the same uploads succeed once it is back', async () => {
    const attachmentPath = `/api/subpopulations/${subpopulations['Cinderbrook Cove']}/attachments`
    const genotypePath = `/api/subpopulations/${subpopulations['Stonelantern Flats']}/genotypes`
    const attach = () => uploadForm(biologist, attachmentPath, { name: 'release-permit.pdf', content: PDF, type: 'application/pdf' })
    const upload = () => uploadForm(biologist, genotypePath, { name: 'alder-hollow.csv', content: ALDER_HOLLOW_CSV, type: 'text/csv' }, { markerType: 'microsatellite' })

    const footprintBefore = await uploadFootprint()
    const keysBefore = (await storedKeys(server)).sort()

    await server.objectStore.stop()
    try {
      for (const response of [await attach(), await upload()]) {
        expectErrorAnswer(response, 503, /^File storage cannot be reached just now, so nothing was saved\. Please try again/)
        expect(JSON.stringify(response.body)).not.toMatch(/ECONNREFUSED|127\.0\.0\.1|stack/i)
      }
      expect(await uploadFootprint()).toEqual(footprintBefore)
      // The app itself keeps answering what does not need the store.
      expect((await biologist.get(`/api/subpopulations/${subpopulations['Cinderbrook Cove']}`)).status).toBe(200)
    } finally {
      await server.objectStore.start()
    }
    expect((await storedKeys(server)).sort()).toEqual(keysBefore)

    const attached = await attach()
    expect(attached.status, JSON.stringify(attached.body)).toBe(201)
    const uploaded = await upload()
    expect(uploaded.status, JSON.stringify(uploaded.body)).toBe(201)
    const footprintAfter = await uploadFootprint()
    expect(footprintAfter.attachments).toBe(footprintBefore.attachments + 1)
    expect(footprintAfter.datasets).toBe(footprintBefore.datasets + 1)

    const attachmentRow = (await server.db.query('SELECT storage_key, checksum_sha256 FROM attachments WHERE id = $1', [attached.body.id])).rows[0]
    const datasetRow = (await server.db.query('SELECT storage_key, checksum_sha256 FROM genetic_datasets WHERE id = $1', [uploaded.body.id])).rows[0]
    // The genotype upload also puts the demo tables in place (they are compared with it): leave those aside.
    const uploadedKeys = (await storedKeys(server)).filter(key => !keysBefore.includes(key) && !key.startsWith('seed/demo-genotypes/'))
    expect(uploadedKeys.sort()).toEqual([attachmentRow.storage_key, datasetRow.storage_key].sort())
    expect(sha256(await storedBytes(attachmentRow.storage_key))).toBe(sha256(PDF))
    expect(attachmentRow.checksum_sha256).toBe(sha256(PDF))
    expect(sha256(await storedBytes(datasetRow.storage_key))).toBe(sha256(new TextEncoder().encode(ALDER_HOLLOW_CSV)))
  })
})

/**
 * POSTs a 12 MB text attachment as a stream; after the first 7 MB (past the 5 MB first part of the
 * multipart upload) `midway` runs before the rest is sent.
 */
async function uploadWithPause(path: string, midway: () => Promise<void>): Promise<{ status: number, body: { message?: string } }> {
  const boundary = '----tributary-fault-boundary'
  const encoder = new TextEncoder()
  const chunk = encoder.encode('census note, repeated to make a large file\n'.repeat(1490)) // about 64 KB
  const total = 12 * 1024 * 1024
  const pauseAt = 7 * 1024 * 1024
  let sent = 0
  let paused = false
  let stage: 'head' | 'body' | 'tail' | 'done' = 'head'
  const body = new ReadableStream<Uint8Array>({
    async pull(controller) {
      if (stage === 'head') {
        controller.enqueue(encoder.encode(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="field-notes.txt"\r\nContent-Type: text/plain\r\n\r\n`))
        stage = 'body'
      } else if (stage === 'body') {
        if (!paused && sent >= pauseAt) {
          paused = true
          await midway()
        }
        controller.enqueue(chunk)
        sent += chunk.length
        if (sent >= total) stage = 'tail'
      } else if (stage === 'tail') {
        controller.enqueue(encoder.encode(`\r\n--${boundary}--\r\n`))
        stage = 'done'
      } else {
        controller.close()
      }
    },
  })
  const response = await fetch(new URL(path, server.url), {
    method: 'POST', body, duplex: 'half',
    headers: { 'content-type': `multipart/form-data; boundary=${boundary}`, 'cookie': biologist.cookieHeader },
  } as RequestInit & { duplex: 'half' })
  const text = await response.text()
  return { status: response.status, body: JSON.parse(text) as { message?: string } }
}

describe('object storage lost in the middle of a large upload', () => {
  it('answers 503, records nothing and leaves no object', async () => {
    const path = `/api/subpopulations/${subpopulations['Cinderbrook Cove']}/attachments`
    const footprintBefore = await uploadFootprint()
    const keysBefore = (await storedKeys(server)).sort()
    let answer: { status: number, body: { message?: string } }
    try {
      answer = await uploadWithPause(path, () => server.objectStore.stop())
    } finally {
      await server.objectStore.start()
    }
    expect(answer.status, JSON.stringify(answer.body)).toBe(503)
    expect(answer.body.message).toMatch(/^File storage cannot be reached just now, so nothing was saved/)
    expect(await uploadFootprint()).toEqual(footprintBefore)
    expect((await storedKeys(server)).sort()).toEqual(keysBefore)

    // And the same large upload goes through with the store up.
    const again = await uploadWithPause(path, async () => {})
    expect(again.status, JSON.stringify(again.body)).toBe(201)
    expect((await uploadFootprint()).attachments).toBe(footprintBefore.attachments + 1)
  }, 60_000)
})
