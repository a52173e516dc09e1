/**
 * `npm run backup` and `npm run restore` end to end (scripts/backup.sh, scripts/restore.sh).
 *
 * This file's database and object store (demo data, the approved demo proposal's signed brief
 * issued, an attachment and a genotype table uploaded) are backed up, then restored into a
 * database that does not exist yet and a fresh object store. Checked: the manifest (row counts
 * and object checksums equal the source), the restored data (same row count in every table, same
 * bytes in every object), a second app started on the restored data serving the very same
 * signed brief, which its POST /api/verify finds valid and issued by Tributary, and the same
 * attachment bytes. Safety: restoring over data without --force changes nothing, with --force it
 * replaces it; a damaged archive is refused before anything is touched.
 */
import { execFile } from 'node:child_process'
import { createHash } from 'node:crypto'
import { cp, mkdtemp, readFile, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { GetObjectCommand, S3Client } from '@aws-sdk/client-s3'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { listObjects } from '../../scripts/backup-lib'
import { startObjectStore, type ObjectStoreServer } from '../../scripts/object-store-lib'
import { ApiClient } from '../support/client'
import { databaseUrl } from '../support/env'
import { dropDatabase } from '../support/db'
import { freePort } from '../support/ports'
import { demo, demoPassword, startAppProcess, useServer, type AppProcess } from '../support/server'
import { getBytes, postFile } from './brief-support'
import { ALDER_HOLLOW_CSV, demoRecords, uploadForm } from './genotypes-support'

const root = fileURLToPath(new URL('../..', import.meta.url))
const server = useServer()
const APPROVED_TITLE = 'Gene flow for Owlfeather Bald (demo, approved)'
const PDF = new TextEncoder().encode('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n')
const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex')

let workDirectory: string
let archive: string
let brief: { bytes: Buffer, sha256: string, documentId: string }
let approvedId: number
let attachmentId: number
const restoredDatabase = `tributary_restored_${process.pid}_${Date.now()}`
const restoredUrl = databaseUrl(restoredDatabase)
let restoredStore: ObjectStoreServer
let restoredApp: AppProcess | undefined

/** Runs `npm run backup` / `npm run restore` (their shell entry points) with the given target. */
function script(name: 'backup' | 'restore', args: string[], target: { databaseUrl: string, s3Endpoint: string }) {
  return new Promise<{ code: number, stdout: string, stderr: string }>((resolve) => {
    execFile('bash', [`scripts/${name}.sh`, ...args], {
      cwd: root,
      env: { ...process.env, ...server.env, NUXT_DATABASE_URL: target.databaseUrl, NUXT_S3_ENDPOINT: target.s3Endpoint },
    }, (error, stdout, stderr) => resolve({ code: error ? Number(error.code ?? 1) : 0, stdout, stderr }))
  })
}

/** One query on its own connection (closed before returning, so a later DROP DATABASE finds none open). */
async function queryOnce(url: string, sql: string) {
  const client = new pg.Client({ connectionString: url })
  await client.connect()
  try {
    return await client.query(sql)
  } finally {
    await client.end()
  }
}

/** Row count of every table (schema.table), as the backup's manifest lists them. */
async function rowCounts(url: string): Promise<Record<string, number>> {
  const client = new pg.Client({ connectionString: url })
  await client.connect()
  try {
    const tables = await client.query<{ schemaname: string, tablename: string }>(
      `SELECT schemaname, tablename FROM pg_tables WHERE schemaname NOT IN ('pg_catalog', 'information_schema') ORDER BY 1, 2`)
    const counts: Record<string, number> = {}
    for (const { schemaname, tablename } of tables.rows) {
      const result = await client.query<{ n: string }>(`SELECT count(*) AS n FROM ONLY ${client.escapeIdentifier(schemaname)}.${client.escapeIdentifier(tablename)}`)
      counts[`${schemaname}.${tablename}`] = Number(result.rows[0]!.n)
    }
    return counts
  } finally {
    await client.end()
  }
}

/** SHA-256 of every object in a store, by key. */
async function objectDigests(endpoint: string): Promise<Record<string, string>> {
  const client = new S3Client({
    endpoint, region: 'us-east-1', forcePathStyle: true, credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
    requestChecksumCalculation: 'WHEN_REQUIRED', responseChecksumValidation: 'WHEN_REQUIRED',
  })
  const digests: Record<string, string> = {}
  try {
    for (const { key } of await listObjects(client, server.objectStore.bucket)) {
      const answer = await client.send(new GetObjectCommand({ Bucket: server.objectStore.bucket, Key: key }))
      digests[key] = sha256(await answer.Body!.transformToByteArray())
    }
  } finally {
    client.destroy()
  }
  return digests
}

beforeAll(async () => {
  workDirectory = await mkdtemp(join(tmpdir(), 'tributary-backup-test-'))
  restoredStore = await startObjectStore({ port: await freePort(), directory: join(workDirectory, 'restored-store') })
  const viewer = await server.signIn(demo.viewer)
  const biologist = await server.signIn(demo.biologist)
  approvedId = (await server.db.query<{ id: number }>('SELECT id FROM proposals WHERE title = $1', [APPROVED_TITLE])).rows[0]!.id
  // Issue the signed brief (stored in issued_briefs) and put files in the object store.
  const issued = await getBytes(viewer, `/api/proposals/${approvedId}/brief.pdf`)
  expect(issued.status).toBe(200)
  brief = { bytes: issued.bytes, sha256: issued.headers.get('x-brief-sha256')!, documentId: issued.headers.get('x-brief-document-id')! }
  const subpopulations = (await demoRecords(server)).subpopulations
  const attached = await uploadForm(biologist, `/api/subpopulations/${subpopulations['Cinderbrook Cove']}/attachments`, { name: 'release-permit.pdf', content: PDF, type: 'application/pdf' })
  expect(attached.status).toBe(201)
  attachmentId = attached.body.id
  const uploaded = await uploadForm(biologist, `/api/subpopulations/${subpopulations['Stonelantern Flats']}/genotypes`, { name: 'alder-hollow.csv', content: ALDER_HOLLOW_CSV, type: 'text/csv' }, { markerType: 'microsatellite' })
  expect(uploaded.status).toBe(201)
}, 120_000)

afterAll(async () => {
  await restoredApp?.stop()
  await restoredStore?.close()
  await dropDatabase(restoredDatabase)
  if (workDirectory) await rm(workDirectory, { recursive: true, force: true })
})

describe('npm run backup', () => {
  it('writes one archive: a custom-format dump and every object, with checksums and row counts that match the source', async () => {
    const source = { databaseUrl: server.databaseUrl, s3Endpoint: server.objectStore.endpoint }
    const backup = await script('backup', ['--out', join(workDirectory, 'backups')], source)
    expect(backup.code, backup.stderr).toBe(0)
    archive = backup.stdout.trim().split('\n').at(-1)!
    expect(archive).toMatch(/backups\/tributary-backup-\d{8}T\d{6}Z$/)

    const manifest = JSON.parse(await readFile(join(archive, 'manifest.json'), 'utf8'))
    expect(manifest.format).toBe('tributary-backup/1')
    const dump = await readFile(join(archive, 'database.dump'))
    expect(dump.subarray(0, 5).toString('latin1')).toBe('PGDMP') // pg_dump's custom format
    expect(manifest.database.sha256).toBe(sha256(dump))
    expect(manifest.database.rowCounts).toEqual(await rowCounts(server.databaseUrl))
    expect(manifest.database.rowCounts['public.issued_briefs']).toBe(1)
    expect(manifest.database.rowCounts['public.attachments']).toBeGreaterThanOrEqual(1)

    const sourceObjects = await objectDigests(server.objectStore.endpoint)
    expect(Object.keys(sourceObjects).length).toBeGreaterThanOrEqual(2)
    const archived: Record<string, string> = {}
    for (const entry of manifest.objectStore.objects) {
      const bytes = await readFile(join(archive, entry.file))
      expect(sha256(bytes)).toBe(entry.sha256)
      expect(entry.file).toMatch(/^objects\/\d{6}$/)
      archived[entry.key] = entry.sha256
    }
    expect(archived).toEqual(sourceObjects)
  }, 60_000)
})

describe('npm run restore', () => {
  const target = () => ({ databaseUrl: restoredUrl, s3Endpoint: restoredStore.endpoint })

  it('refuses a damaged archive before touching anything', async () => {
    const damaged = join(workDirectory, 'damaged')
    await cp(archive, damaged, { recursive: true })
    const manifest = JSON.parse(await readFile(join(damaged, 'manifest.json'), 'utf8'))
    const victim = join(damaged, manifest.objectStore.objects[0].file)
    const bytes = await readFile(victim)
    bytes[0] = (bytes[0] ?? 0) ^ 0x01
    await writeFile(victim, bytes)
    const refused = await script('restore', [damaged], target())
    expect(refused.code).not.toBe(0)
    expect(refused.stderr).toMatch(/the archive is damaged: objects\/\d{6} does not match its checksum; nothing was restored/)
    const exists = await server.db.query('SELECT 1 FROM pg_database WHERE datname = $1', [restoredDatabase])
    expect(exists.rowCount).toBe(0)
    expect(await objectDigests(restoredStore.endpoint)).toEqual({})
  }, 60_000)

  it('restores into a new database and an empty bucket: the same rows in every table and the same bytes in every object', async () => {
    const restored = await script('restore', [archive], target())
    expect(restored.code, restored.stderr).toBe(0)
    expect(restored.stdout).toMatch(/match the backup/)
    expect(await rowCounts(restoredUrl)).toEqual(await rowCounts(server.databaseUrl))
    expect(await objectDigests(restoredStore.endpoint)).toEqual(await objectDigests(server.objectStore.endpoint))
  }, 60_000)

  it('refuses to restore over data without --force (nothing changes); --force replaces it', async () => {
    const changedAgencies = async () => (await queryOnce(restoredUrl, `SELECT count(*)::int AS n FROM agencies WHERE name LIKE '%(changed after restore)'`)).rows[0].n as number
    await queryOnce(restoredUrl, `UPDATE agencies SET name = name || ' (changed after restore)'`)

    const refused = await script('restore', [archive], target())
    expect(refused.code).not.toBe(0)
    expect(refused.stderr).toMatch(/already has tables; the bucket tributary .* already has objects\. Nothing was changed\. .*--force/)
    expect(await changedAgencies()).toBeGreaterThan(0)

    const forced = await script('restore', [archive, '--force'], target())
    expect(forced.code, forced.stderr).toBe(0)
    expect(await changedAgencies()).toBe(0)
    expect(await rowCounts(restoredUrl)).toEqual(await rowCounts(server.databaseUrl))
  }, 60_000)

  it('an app on the restored data serves the same signed brief, which still verifies, and the same attachment', async () => {
    const port = await freePort()
    const url = `http://127.0.0.1:${port}`
    restoredApp = await startAppProcess(url, {
      ...server.env, PORT: String(port), NUXT_APP_URL: url, NUXT_DATABASE_URL: restoredUrl, NUXT_S3_ENDPOINT: restoredStore.endpoint,
      TRIBUTARY_MAIL_DISPATCHER: 'off',
    })
    const viewer = new ApiClient(url)
    expect((await viewer.post('/api/auth/login', { email: demo.viewer, password: demoPassword })).status).toBe(200)

    const served = await getBytes(viewer, `/api/proposals/${approvedId}/brief.pdf`)
    expect(served.status).toBe(200)
    expect(Buffer.compare(served.bytes, brief.bytes)).toBe(0)
    const verified = await postFile(new ApiClient(url), '/api/verify', { name: 'brief.pdf', type: 'application/pdf', bytes: served.bytes })
    expect(verified.status).toBe(200)
    expect(verified.body).toMatchObject({
      signatureValid: true, signed: true, sha256: brief.sha256,
      issuedByTributary: { documentId: brief.documentId, proposalTitle: APPROVED_TITLE },
    })
    expect(verified.body.message).toMatch(/^Valid\./)

    const link = await viewer.get(`/api/attachments/${attachmentId}/download`)
    expect(link.status).toBe(200)
    expect(link.body.url.startsWith(restoredStore.endpoint)).toBe(true)
    const file = await fetch(link.body.url)
    expect(new Uint8Array(await file.arrayBuffer())).toEqual(PDF)
  }, 60_000)
})
