/**
 * `npm run backup [-- --out DIR]` — writes one archive directory with the whole database
 * (pg_dump, custom format) and every object of the object store, plus a manifest with SHA-256
 * checksums and the row count of every table (layout: scripts/backup-lib.ts).
 *
 * Source: NUXT_DATABASE_URL and NUXT_S3_* (the app's own settings; defaults are the local
 * services of `npm start`). Archives go to DIR, else TRIBUTARY_BACKUP_DIR, else .data/backups.
 * The archive is written under a `.partial` name and renamed when complete, so a directory
 * without that ending is always a finished backup. Prints the archive's path last.
 *
 * Consistency: the row counts and the dump come from one database snapshot (pg_dump
 * --snapshot). Objects are copied after the dump; because uploads store the object before the
 * record commits, every object the dump refers to is in the archive (objects uploaded during
 * the backup may be too, harmlessly).
 */
import { execFile } from 'node:child_process'
import { createWriteStream } from 'node:fs'
import { mkdir, rename, rm, writeFile } from 'node:fs/promises'
import { join, resolve } from 'node:path'
import type { Readable } from 'node:stream'
import { pipeline } from 'node:stream/promises'
import { promisify } from 'node:util'
import { GetObjectCommand } from '@aws-sdk/client-s3'
import pg from 'pg'
import { describeDatabaseUrl } from '../server/db/connection'
import { objectStoreSettingsFromEnv } from '../server/utils/storage'
import {
  ARCHIVE_FORMAT, DATABASE_FILE, MANIFEST_FILE, OBJECTS_FOLDER, archiveName, fileDigest, libpqEnv, listObjects,
  parseArguments, s3ClientFor, type ArchivedObject, type BackupManifest,
} from './backup-lib'

const run = promisify(execFile)

/** Dumps the database to `path`; returns the row counts seen in the dump's snapshot. */
async function dumpDatabase(url: string, path: string): Promise<Record<string, number>> {
  const client = new pg.Client({ connectionString: url, application_name: 'tributary-backup' })
  await client.connect()
  try {
    await client.query('BEGIN ISOLATION LEVEL REPEATABLE READ READ ONLY')
    const snapshot = (await client.query<{ id: string }>('SELECT pg_export_snapshot() AS id')).rows[0]!.id
    const tables = await client.query<{ schemaname: string, tablename: string }>(
      `SELECT schemaname, tablename FROM pg_tables
        WHERE schemaname NOT IN ('pg_catalog', 'information_schema') ORDER BY schemaname, tablename`)
    const rowCounts: Record<string, number> = {}
    for (const { schemaname, tablename } of tables.rows) {
      const name = `${client.escapeIdentifier(schemaname)}.${client.escapeIdentifier(tablename)}`
      rowCounts[`${schemaname}.${tablename}`] = Number((await client.query<{ n: string }>(`SELECT count(*) AS n FROM ONLY ${name}`)).rows[0]!.n)
    }
    await run('pg_dump', ['--format=custom', '--no-owner', '--no-acl', `--snapshot=${snapshot}`, `--file=${path}`], {
      env: { ...process.env, ...libpqEnv(url) }, maxBuffer: 16 * 1024 * 1024,
    })
    await client.query('COMMIT')
    return rowCounts
  } finally {
    await client.end()
  }
}

async function main() {
  const args = parseArguments(process.argv.slice(2), [], ['--out'])
  const databaseUrl = process.env.NUXT_DATABASE_URL
  if (!databaseUrl) throw new Error('NUXT_DATABASE_URL is not set (npm run backup sets the local default).')
  const settings = objectStoreSettingsFromEnv()
  const parent = resolve(args.options.get('--out') ?? process.env.TRIBUTARY_BACKUP_DIR ?? join(process.env.TRIBUTARY_STATE_DIR ?? '.data', 'backups'))
  const createdAt = new Date()
  const finalPath = join(parent, archiveName(createdAt))
  const workPath = `${finalPath}.partial`
  await rm(workPath, { recursive: true, force: true })
  await mkdir(join(workPath, OBJECTS_FOLDER), { recursive: true })

  try {
    console.info(`[backup] database ${describeDatabaseUrl(databaseUrl)}`)
    const rowCounts = await dumpDatabase(databaseUrl, join(workPath, DATABASE_FILE))
    const dumpDigest = await fileDigest(join(workPath, DATABASE_FILE))

    console.info(`[backup] objects of bucket ${settings.bucket} at ${settings.endpoint}`)
    const client = s3ClientFor(settings)
    const objects: ArchivedObject[] = []
    try {
      const listed = await listObjects(client, settings.bucket)
      for (const [index, entry] of listed.entries()) {
        const file = `${OBJECTS_FOLDER}/${String(index + 1).padStart(6, '0')}`
        const answer = await client.send(new GetObjectCommand({ Bucket: settings.bucket, Key: entry.key }))
        await pipeline(answer.Body as Readable, createWriteStream(join(workPath, file)))
        objects.push({ key: entry.key, file, contentType: answer.ContentType ?? null, ...await fileDigest(join(workPath, file)) })
      }
    } finally {
      client.destroy()
    }

    const manifest: BackupManifest = {
      format: ARCHIVE_FORMAT,
      createdAt: createdAt.toISOString(),
      database: { source: describeDatabaseUrl(databaseUrl), file: DATABASE_FILE, ...dumpDigest, rowCounts },
      objectStore: { endpoint: settings.endpoint, bucket: settings.bucket, objects },
    }
    await writeFile(join(workPath, MANIFEST_FILE), `${JSON.stringify(manifest, null, 2)}\n`)
    await rename(workPath, finalPath)
    const rows = Object.values(rowCounts).reduce((sum, n) => sum + n, 0)
    console.info(`[backup] ${Object.keys(rowCounts).length} tables (${rows} rows), ${objects.length} objects`)
    console.info(finalPath)
  } catch (error) {
    await rm(workPath, { recursive: true, force: true })
    throw error
  }
}

main().catch((error: unknown) => {
  console.error(`[backup] failed: ${error instanceof Error ? error.message : String(error)}`)
  process.exit(1)
})
