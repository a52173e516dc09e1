/**
 * `npm run restore -- ARCHIVE [--database-url URL] [--force]` — puts a backup made by
 * `npm run backup` back: the database with pg_restore (in one transaction) and every object into
 * the bucket, then checks the row count of every table and the key and size of every object
 * against the manifest.
 *
 * Target: the database of --database-url, else NUXT_DATABASE_URL; the bucket of NUXT_S3_*.
 * Safe by default — both targets are checked before anything changes:
 * - the database may be missing (it is created) or empty (no tables); a database with tables is
 *   refused unless --force, which DROPS it (ending its sessions) and creates it afresh;
 * - the bucket may be missing (it is created) or empty; a bucket with objects is refused unless
 *   --force, which DELETES every object in it first.
 * The archive is verified first (every file against its SHA-256); a damaged archive changes
 * nothing. Stop the app (and workers) before restoring over a database they use.
 */
import { execFile } from 'node:child_process'
import { createReadStream } from 'node:fs'
import { readFile } from 'node:fs/promises'
import { join, resolve } from 'node:path'
import { promisify } from 'node:util'
import { CreateBucketCommand, DeleteObjectCommand, HeadBucketCommand, type S3Client } from '@aws-sdk/client-s3'
import { Upload } from '@aws-sdk/lib-storage'
import pg from 'pg'
import { describeDatabaseUrl } from '../server/db/connection'
import { objectStoreSettingsFromEnv } from '../server/utils/storage'
import {
  ARCHIVE_FORMAT, MANIFEST_FILE, fileDigest, libpqEnv, listObjects, parseArguments, s3ClientFor, withDatabase,
  type BackupManifest,
} from './backup-lib'

const run = promisify(execFile)

async function withClient<T>(url: string, fn: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: url, application_name: 'tributary-restore' })
  await client.connect()
  try {
    return await fn(client)
  } finally {
    await client.end()
  }
}

/** Reads the manifest and checks every file of the archive against it. */
async function verifiedManifest(archive: string): Promise<BackupManifest> {
  const manifest = JSON.parse(await readFile(join(archive, MANIFEST_FILE), 'utf8')) as BackupManifest
  if (manifest.format !== ARCHIVE_FORMAT) throw new Error(`${archive} is not a Tributary backup (format ${String(manifest.format)})`)
  const files = [
    { file: manifest.database.file, sha256: manifest.database.sha256 },
    ...manifest.objectStore.objects.map(entry => ({ file: entry.file, sha256: entry.sha256 })),
  ]
  for (const { file, sha256 } of files) {
    if (!/^(database\.dump|objects\/\d{6,})$/.test(file)) throw new Error(`the manifest names an unexpected file: ${file}`)
    const digest = await fileDigest(join(archive, file))
    if (digest.sha256 !== sha256) throw new Error(`the archive is damaged: ${file} does not match its checksum; nothing was restored`)
  }
  return manifest
}

/** 'missing', 'empty' (no tables) or 'in use' (has tables). */
async function databaseState(url: string): Promise<'missing' | 'empty' | 'in use'> {
  const name = libpqEnv(url).PGDATABASE
  const exists = await withClient(withDatabase(url, 'postgres'), async client =>
    (await client.query('SELECT 1 FROM pg_database WHERE datname = $1', [name])).rowCount === 1)
  if (!exists) return 'missing'
  const tables = await withClient(url, async client => Number((await client.query<{ n: string }>(
    `SELECT count(*) AS n FROM pg_tables WHERE schemaname NOT IN ('pg_catalog', 'information_schema')`)).rows[0]!.n))
  return tables === 0 ? 'empty' : 'in use'
}

/** 'missing', 'empty' or 'in use' (has objects). */
async function bucketState(client: S3Client, bucket: string): Promise<'missing' | 'empty' | 'in use'> {
  try {
    await client.send(new HeadBucketCommand({ Bucket: bucket }))
  } catch (error) {
    const status = Number((error as { $metadata?: { httpStatusCode?: unknown } }).$metadata?.httpStatusCode)
    if (status === 404) return 'missing'
    throw error
  }
  return (await listObjects(client, bucket)).length === 0 ? 'empty' : 'in use'
}

async function recreateDatabase(url: string, dropFirst: boolean): Promise<void> {
  const name = libpqEnv(url).PGDATABASE
  await withClient(withDatabase(url, 'postgres'), async (client) => {
    if (dropFirst) await client.query(`DROP DATABASE IF EXISTS ${client.escapeIdentifier(name)} WITH (FORCE)`)
    await client.query(`CREATE DATABASE ${client.escapeIdentifier(name)}`)
  })
}

async function restoreObjects(client: S3Client, bucket: string, archive: string, manifest: BackupManifest, state: 'missing' | 'empty' | 'in use') {
  if (state === 'missing') await client.send(new CreateBucketCommand({ Bucket: bucket }))
  if (state === 'in use') {
    for (const entry of await listObjects(client, bucket)) await client.send(new DeleteObjectCommand({ Bucket: bucket, Key: entry.key }))
  }
  for (const entry of manifest.objectStore.objects) {
    await new Upload({
      client,
      params: { Bucket: bucket, Key: entry.key, Body: createReadStream(join(archive, entry.file)), ContentType: entry.contentType ?? undefined },
    }).done()
  }
}

/** Differences between the manifest and what is now in the database and the bucket (empty = all there). */
async function differences(url: string, client: S3Client, bucket: string, manifest: BackupManifest): Promise<string[]> {
  const found: string[] = []
  await withClient(url, async (db) => {
    for (const [table, expected] of Object.entries(manifest.database.rowCounts)) {
      const [schema, name] = table.split('.') as [string, string]
      const actual = Number((await db.query<{ n: string }>(`SELECT count(*) AS n FROM ONLY ${db.escapeIdentifier(schema)}.${db.escapeIdentifier(name)}`)).rows[0]!.n)
      if (actual !== expected) found.push(`table ${table}: ${actual} rows, the backup has ${expected}`)
    }
  })
  const stored = new Map((await listObjects(client, bucket)).map(entry => [entry.key, entry.sizeBytes]))
  for (const entry of manifest.objectStore.objects) {
    if (stored.get(entry.key) !== entry.sizeBytes) found.push(`object ${entry.key}: ${stored.has(entry.key) ? `${stored.get(entry.key)} bytes` : 'missing'}, the backup has ${entry.sizeBytes} bytes`)
  }
  return found
}

async function main() {
  const args = parseArguments(process.argv.slice(2), ['--force'], ['--database-url'])
  const archivePath = args.rest[0]
  if (!archivePath || args.rest.length > 1) throw new Error('usage: npm run restore -- ARCHIVE_DIRECTORY [--database-url URL] [--force]')
  const archive = resolve(archivePath)
  const force = args.flags.has('--force')
  const databaseUrl = args.options.get('--database-url') ?? process.env.NUXT_DATABASE_URL
  if (!databaseUrl) throw new Error('no target database: give --database-url or set NUXT_DATABASE_URL')
  const settings = objectStoreSettingsFromEnv()

  const manifest = await verifiedManifest(archive)
  console.info(`[restore] archive of ${manifest.createdAt} verified (${manifest.objectStore.objects.length} objects)`)

  const client = s3ClientFor(settings)
  try {
    const database = await databaseState(databaseUrl)
    const bucket = await bucketState(client, settings.bucket)
    const refusals: string[] = []
    if (database === 'in use' && !force) refusals.push(`the database ${describeDatabaseUrl(databaseUrl)} already has tables`)
    if (bucket === 'in use' && !force) refusals.push(`the bucket ${settings.bucket} at ${settings.endpoint} already has objects`)
    if (refusals.length > 0) throw new Error(`${refusals.join('; ')}. Nothing was changed. Restore into an empty target, or add --force to replace what is there.`)

    console.info(`[restore] database ${describeDatabaseUrl(databaseUrl)} (${database}${database === 'in use' ? ', replaced' : ''})`)
    if (database !== 'empty') await recreateDatabase(databaseUrl, database === 'in use')
    const target = libpqEnv(databaseUrl)
    await run('pg_restore', ['--no-owner', '--no-acl', '--exit-on-error', '--single-transaction', `--dbname=${target.PGDATABASE}`, join(archive, manifest.database.file)], {
      env: { ...process.env, ...target }, maxBuffer: 16 * 1024 * 1024,
    })

    console.info(`[restore] bucket ${settings.bucket} at ${settings.endpoint} (${bucket}${bucket === 'in use' ? ', emptied first' : ''})`)
    await restoreObjects(client, settings.bucket, archive, manifest, bucket)

    const problems = await differences(databaseUrl, client, settings.bucket, manifest)
    if (problems.length > 0) throw new Error(`the restored data differs from the backup:\n  ${problems.join('\n  ')}`)
    const rows = Object.values(manifest.database.rowCounts).reduce((sum, n) => sum + n, 0)
    console.info(`[restore] done: ${Object.keys(manifest.database.rowCounts).length} tables (${rows} rows) and ${manifest.objectStore.objects.length} objects match the backup`)
  } finally {
    client.destroy()
  }
}

main().catch((error: unknown) => {
  console.error(`[restore] failed: ${error instanceof Error ? error.message : String(error)}`)
  process.exit(1)
})
