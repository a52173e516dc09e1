/**
 * What `npm run backup` and `npm run restore` share: the archive layout and its manifest,
 * checksums, PostgreSQL client settings from a URL, and object-store listing.
 *
 * An archive is one directory, `tributary-backup-<UTC time>/`:
 *
 *   manifest.json    format, time, source, row counts per table, and every file with its SHA-256
 *   database.dump    pg_dump custom format (no owners, no privileges) of the whole database
 *   objects/000001…  every object of the bucket, one file each (the key is in the manifest)
 *
 * Objects are stored under numbered names, never under their keys, so no key can write outside
 * the archive.
 */
import { createHash } from 'node:crypto'
import { createReadStream } from 'node:fs'
import { ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3'
import type { ObjectStoreSettings } from '../server/utils/storage'

export const MANIFEST_FILE = 'manifest.json'
export const DATABASE_FILE = 'database.dump'
export const OBJECTS_FOLDER = 'objects'
export const ARCHIVE_FORMAT = 'tributary-backup/1'

/** One stored object in the archive. */
export interface ArchivedObject {
  key: string
  /** path inside the archive, e.g. objects/000001 */
  file: string
  sizeBytes: number
  sha256: string
  contentType: string | null
}

export interface BackupManifest {
  format: typeof ARCHIVE_FORMAT
  createdAt: string
  database: {
    /** host:port/name of the source (no password) */
    source: string
    file: string
    sizeBytes: number
    sha256: string
    /** rows per table (schema.table) in the same snapshot as the dump */
    rowCounts: Record<string, number>
  }
  objectStore: {
    endpoint: string
    bucket: string
    objects: ArchivedObject[]
  }
}

/** SHA-256 (hex) and size of a file, read as a stream. */
export async function fileDigest(path: string): Promise<{ sha256: string, sizeBytes: number }> {
  const hash = createHash('sha256')
  let sizeBytes = 0
  for await (const chunk of createReadStream(path)) {
    hash.update(chunk as Buffer)
    sizeBytes += (chunk as Buffer).length
  }
  return { sha256: hash.digest('hex'), sizeBytes }
}

/**
 * libpq environment (PGHOST, PGPORT, PGUSER, PGPASSWORD, PGDATABASE) for a postgres:// URL, so
 * pg_dump and pg_restore never show the password on their command line.
 */
export function libpqEnv(url: string): { PGHOST: string, PGPORT: string, PGUSER: string, PGPASSWORD: string, PGDATABASE: string } {
  const parsed = new URL(url)
  return {
    PGHOST: parsed.hostname,
    PGPORT: parsed.port || '5432',
    PGUSER: decodeURIComponent(parsed.username),
    PGPASSWORD: decodeURIComponent(parsed.password),
    PGDATABASE: decodeURIComponent(parsed.pathname.replace(/^\//, '')),
  }
}

/** The same URL pointing at another database on the same server. */
export function withDatabase(url: string, name: string): string {
  const parsed = new URL(url)
  parsed.pathname = `/${encodeURIComponent(name)}`
  return parsed.toString()
}

/** An S3 client for the app's object-store settings (the same options the app uses). */
export function s3ClientFor(settings: ObjectStoreSettings): S3Client {
  return new S3Client({
    endpoint: settings.endpoint,
    region: settings.region,
    forcePathStyle: settings.forcePathStyle,
    credentials: { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey },
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  })
}

/** Every key in `bucket` with its size, in key order. */
export async function listObjects(client: S3Client, bucket: string): Promise<{ key: string, sizeBytes: number }[]> {
  const found: { key: string, sizeBytes: number }[] = []
  let token: string | undefined
  do {
    const page = await client.send(new ListObjectsV2Command({ Bucket: bucket, ContinuationToken: token }))
    for (const entry of page.Contents ?? []) if (entry.Key) found.push({ key: entry.Key, sizeBytes: Number(entry.Size ?? 0) })
    token = page.IsTruncated ? page.NextContinuationToken : undefined
  } while (token)
  return found.sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0))
}

/** Name of a new archive directory for `now`: tributary-backup-20261202T114500Z. */
export function archiveName(now: Date): string {
  return `tributary-backup-${now.toISOString().replace(/[-:]/g, '').replace(/\.\d+Z$/, 'Z')}`
}

/** Reads `--name value` options and bare arguments. */
export function parseArguments(argv: string[], flags: string[], options: string[]): { flags: Set<string>, options: Map<string, string>, rest: string[] } {
  const result = { flags: new Set<string>(), options: new Map<string, string>(), rest: [] as string[] }
  for (let index = 0; index < argv.length; index++) {
    const argument = argv[index]!
    if (flags.includes(argument)) result.flags.add(argument)
    else if (options.includes(argument)) {
      const value = argv[++index]
      if (value === undefined) throw new Error(`${argument} needs a value`)
      result.options.set(argument, value)
    } else if (argument.startsWith('--')) throw new Error(`unknown option ${argument}`)
    else result.rest.push(argument)
  }
  return result
}
