/**
 * Object storage (S3 API through the AWS SDK v3) for uploaded files: genotype tables and
 * attachments. One client per process, from `runtimeConfig.s3` (env NUXT_S3_ENDPOINT,
 * NUXT_S3_REGION, NUXT_S3_BUCKET, NUXT_S3_ACCESS_KEY_ID, NUXT_S3_SECRET_ACCESS_KEY,
 * NUXT_S3_FORCE_PATH_STYLE, NUXT_S3_PUBLIC_ENDPOINT, NUXT_S3_DOWNLOAD_LINK_SECONDS; README:
 * Settings). Locally the store is s3rver on loopback (scripts/object-store.ts).
 *
 *   const store = useObjectStore()
 *   await store.checkReachable()                       // 503 early when storage is down
 *   const upload = store.putStream(key, stream, { contentType })
 *   const { url } = await store.downloadLink(key, { fileName, contentType })
 *
 * Keys are made by the app (`objectKey`), never from a user's file name. When the store cannot
 * be reached, `objectStoreUnavailableError()` is the 503 every route answers, with a message
 * that says nothing was saved.
 *
 * Everything here except `useObjectStore` is plain Node (no Nitro globals), so the demo seed
 * (seeds/0002-demo-genotypes.ts) uses `createObjectStore` with settings from the environment.
 */
import { randomUUID } from 'node:crypto'
import type { Readable } from 'node:stream'
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  PutObjectCommand,
  S3Client,
  type S3ClientConfig,
} from '@aws-sdk/client-s3'
import { Upload } from '@aws-sdk/lib-storage'
import { getSignedUrl } from '@aws-sdk/s3-request-presigner'

/** Where objects live and how to reach them. */
export interface ObjectStoreSettings {
  endpoint: string
  region: string
  bucket: string
  accessKeyId: string
  secretAccessKey: string
  forcePathStyle: boolean
  /** endpoint used in download links, when browsers reach the store by another address ('' = `endpoint`) */
  publicEndpoint: string
  /** lifetime of a download link, seconds (1 … 604800) */
  downloadLinkSeconds: number
}

/** Defaults for local work: s3rver on loopback (scripts/object-store.ts). */
export const DEFAULT_OBJECT_STORE_SETTINGS: ObjectStoreSettings = {
  endpoint: 'http://127.0.0.1:4569',
  region: 'us-east-1',
  bucket: 'tributary',
  accessKeyId: 'S3RVER',
  secretAccessKey: 'S3RVER',
  forcePathStyle: true,
  publicEndpoint: '',
  downloadLinkSeconds: 300,
}

/** The 503 message when storage is down during a change: says nothing was saved and what to do. */
export const OBJECT_STORE_UNAVAILABLE_MESSAGE = 'File storage cannot be reached just now, so nothing was saved. Please try again in a few minutes; if it keeps happening, tell your administrator.'
/** The 503 message when storage is down while reading. */
export const OBJECT_STORE_UNREADABLE_MESSAGE = 'File storage cannot be reached just now, so the stored files cannot be read. Please try again in a few minutes; if it keeps happening, tell your administrator.'

function text(value: unknown, fallback: string): string {
  return typeof value === 'string' && value.trim() !== '' ? value.trim() : fallback
}

function flag(value: unknown, fallback: boolean): boolean {
  if (typeof value === 'boolean') return value
  if (value === 'true' || value === '1' || value === 1) return true
  if (value === 'false' || value === '0' || value === 0) return false
  return fallback
}

function seconds(value: unknown, fallback: number): number {
  const number = typeof value === 'string' && value.trim() !== '' ? Number(value) : value
  return typeof number === 'number' && Number.isInteger(number) && number >= 1 && number <= 604_800 ? number : fallback
}

/**
 * Settings from a loose record (runtimeConfig.s3, or NUXT_S3_* read from the environment):
 * strings are trimmed, flags and numbers accept their text forms, blanks take the defaults.
 */
export function objectStoreSettingsFrom(raw: Record<string, unknown> | undefined): ObjectStoreSettings {
  const source = raw ?? {}
  const defaults = DEFAULT_OBJECT_STORE_SETTINGS
  return {
    endpoint: text(source.endpoint, defaults.endpoint),
    region: text(source.region, defaults.region),
    bucket: text(source.bucket, defaults.bucket),
    accessKeyId: text(source.accessKeyId, defaults.accessKeyId),
    secretAccessKey: text(source.secretAccessKey, defaults.secretAccessKey),
    forcePathStyle: flag(source.forcePathStyle, defaults.forcePathStyle),
    publicEndpoint: text(source.publicEndpoint, ''),
    downloadLinkSeconds: seconds(source.downloadLinkSeconds, defaults.downloadLinkSeconds),
  }
}

/** Settings from NUXT_S3_* environment variables (for scripts and seeds that run outside Nitro). */
export function objectStoreSettingsFromEnv(env: NodeJS.ProcessEnv = process.env): ObjectStoreSettings {
  return objectStoreSettingsFrom({
    endpoint: env.NUXT_S3_ENDPOINT,
    region: env.NUXT_S3_REGION,
    bucket: env.NUXT_S3_BUCKET,
    accessKeyId: env.NUXT_S3_ACCESS_KEY_ID,
    secretAccessKey: env.NUXT_S3_SECRET_ACCESS_KEY,
    forcePathStyle: env.NUXT_S3_FORCE_PATH_STYLE,
    publicEndpoint: env.NUXT_S3_PUBLIC_ENDPOINT,
    downloadLinkSeconds: env.NUXT_S3_DOWNLOAD_LINK_SECONDS,
  })
}

/** A storage key for a new object: `<area>/<agency>/<owner>/<random>.<ext>`; no user text in it. */
export function objectKey(area: 'genotypes' | 'attachments', agencyId: number, ownerId: number, extension: string): string {
  const ending = /^\.[a-z0-9]{1,8}$/.test(extension) ? extension : ''
  return `${area}/agency-${agencyId}/owner-${ownerId}/${randomUUID()}${ending}`
}

/** An upload in progress: await `done`, or `abort()` it. */
export interface ObjectUpload {
  done: Promise<void>
  abort(): Promise<void>
}

/** What the app does with its object store. */
export interface ObjectStore {
  readonly settings: ObjectStoreSettings
  /** Throws (an SDK error) when the store or its bucket cannot be reached; quick. */
  checkReachable(): Promise<void>
  /** Streams `body` to `key` (multipart above 5 MB), never holding the whole file. */
  putStream(key: string, body: Readable, options: { contentType: string }): ObjectUpload
  /** Stores a small buffer at `key`. */
  putBuffer(key: string, body: Buffer, options: { contentType: string }): Promise<void>
  /** The object's bytes; refuses objects larger than `maxBytes` (Error). */
  getBuffer(key: string, maxBytes: number): Promise<Buffer>
  /** Deletes `key`; deleting a missing key is not an error. */
  remove(key: string): Promise<void>
  /** A presigned GET link, valid for `settings.downloadLinkSeconds`, that downloads as `fileName`. */
  downloadLink(key: string, options: { fileName: string, contentType: string }): Promise<{ url: string, expiresAt: Date, expiresInSeconds: number }>
}

function clientConfig(settings: ObjectStoreSettings, endpoint: string): S3ClientConfig {
  return {
    endpoint,
    region: settings.region,
    forcePathStyle: settings.forcePathStyle,
    credentials: { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey },
    // S3-compatible stores (s3rver, many appliances) do not understand the newer streaming
    // checksum trailers; send checksums only where the API requires them.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
    // Fail fast when the store is down (a clear 503 instead of a hanging upload).
    maxAttempts: 2,
    requestHandler: { connectionTimeout: 3000, requestTimeout: 60_000 },
  }
}

/**
 * A `Content-Disposition` value that downloads as `fileName`: an ASCII fallback plus the
 * UTF-8 form (RFC 6266 / RFC 8187), quotes and control characters removed.
 *
 * @example contentDisposition('Permit 2024 (Ö).pdf') // 'attachment; filename="Permit 2024 (_).pdf"; filename*=UTF-8\'\'Permit%202024%20%28%C3%96%29.pdf'
 */
export function contentDisposition(fileName: string): string {
  // eslint-disable-next-line no-control-regex -- control characters are exactly what must go
  const cleaned = fileName.replace(/[\u0000-\u001F\u007F"\\]/g, '_')
    // encodeURIComponent throws on half a surrogate pair; such a name must still download
    .replace(/[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g, '\uFFFD')
  const ascii = cleaned.replace(/[^\u0020-\u007E]/g, '_')
  const encoded = encodeURIComponent(cleaned).replace(/['()*]/g, char => `%${char.charCodeAt(0).toString(16).toUpperCase()}`)
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encoded}`
}

async function bodyToBuffer(body: unknown, maxBytes: number, key: string): Promise<Buffer> {
  const chunks: Buffer[] = []
  let total = 0
  for await (const chunk of body as AsyncIterable<Uint8Array>) {
    total += chunk.length
    if (total > maxBytes) throw new Error(`object ${key} is larger than ${maxBytes} bytes`)
    chunks.push(Buffer.from(chunk))
  }
  return Buffer.concat(chunks)
}

/**
 * An object store on `settings` (no network call until used).
 *
 * @param settings - endpoint, bucket, credentials, link lifetime
 * @returns the store's operations
 */
export function createObjectStore(settings: ObjectStoreSettings): ObjectStore {
  const client = new S3Client(clientConfig(settings, settings.endpoint))
  const signer = settings.publicEndpoint && settings.publicEndpoint !== settings.endpoint
    ? new S3Client(clientConfig(settings, settings.publicEndpoint))
    : client
  const Bucket = settings.bucket

  return {
    settings,
    async checkReachable() {
      await client.send(new HeadBucketCommand({ Bucket }))
    },
    putStream(key, body, { contentType }) {
      const upload = new Upload({ client, params: { Bucket, Key: key, Body: body, ContentType: contentType }, leavePartsOnError: false })
      return {
        done: upload.done().then(() => undefined),
        abort: () => upload.abort().catch(() => undefined),
      }
    },
    async putBuffer(key, body, { contentType }) {
      await client.send(new PutObjectCommand({ Bucket, Key: key, Body: body, ContentType: contentType }))
    },
    async getBuffer(key, maxBytes) {
      const answer = await client.send(new GetObjectCommand({ Bucket, Key: key }))
      if (answer.ContentLength !== undefined && answer.ContentLength > maxBytes) {
        throw new Error(`object ${key} is larger than ${maxBytes} bytes`)
      }
      return bodyToBuffer(answer.Body, maxBytes, key)
    },
    async remove(key) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: key }))
    },
    async downloadLink(key, { fileName, contentType }) {
      const expiresInSeconds = settings.downloadLinkSeconds
      const command = new GetObjectCommand({
        Bucket, Key: key,
        ResponseContentDisposition: contentDisposition(fileName),
        ResponseContentType: contentType,
      })
      const url = await getSignedUrl(signer, command, { expiresIn: expiresInSeconds })
      return { url, expiresAt: new Date(Date.now() + expiresInSeconds * 1000), expiresInSeconds }
    },
  }
}

interface ErrorFields {
  name?: unknown
  code?: unknown
  message?: unknown
  $metadata?: { httpStatusCode?: unknown }
  cause?: unknown
  errors?: unknown
}

const NETWORK_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH', 'ENOTFOUND', 'EAI_AGAIN', 'EPIPE', 'UND_ERR_SOCKET'])
const NETWORK_NAMES = new Set(['TimeoutError', 'RequestTimeout', 'NoSuchBucket', 'ServiceUnavailable', 'SlowDown', 'InternalError'])

/**
 * True when `error` means the store cannot serve us now (connection refused or reset, time-out,
 * missing bucket, 5xx from the store), as opposed to a fault in our request.
 */
export function isObjectStoreUnavailable(error: unknown): boolean {
  let current: unknown = error
  for (let depth = 0; depth < 5 && current && typeof current === 'object'; depth++) {
    const fields = current as ErrorFields
    if (typeof fields.code === 'string' && NETWORK_CODES.has(fields.code)) return true
    if (typeof fields.name === 'string' && NETWORK_NAMES.has(fields.name)) return true
    const status = Number(fields.$metadata?.httpStatusCode)
    if (Number.isInteger(status) && status >= 500) return true
    if (Array.isArray(fields.errors) && fields.errors.some(inner => isObjectStoreUnavailable(inner))) return true
    current = fields.cause
  }
  return false
}

/** True when `error` says the key does not exist. */
export function isMissingObject(error: unknown): boolean {
  const fields = (error ?? {}) as ErrorFields
  return fields.name === 'NoSuchKey' || fields.name === 'NotFound' || Number(fields.$metadata?.httpStatusCode) === 404
}

/**
 * The 503 answer for "storage is down; nothing was saved". The cause is logged here, not
 * attached: the error handler would read a connection error in the chain as a database outage.
 */
export function objectStoreUnavailableError(cause?: unknown, during: 'change' | 'read' = 'change') {
  if (cause !== undefined) console.warn('[storage] object storage unreachable:', cause instanceof Error ? `${cause.name}: ${cause.message}` : cause)
  const message = during === 'read' ? OBJECT_STORE_UNREADABLE_MESSAGE : OBJECT_STORE_UNAVAILABLE_MESSAGE
  return createError({ status: 503, statusText: 'Service Unavailable', message })
}

/** Storage outages become the 503 answer (worded for a change or a read); other errors unchanged. */
export function asObjectStoreError(error: unknown, during: 'change' | 'read' = 'change'): unknown {
  const answered = (error ?? {}) as { statusCode?: unknown, message?: unknown }
  if (Number(answered.statusCode) === 503) {
    // A read that failed inside a change: say that nothing was saved.
    return during === 'change' && answered.message === OBJECT_STORE_UNREADABLE_MESSAGE ? objectStoreUnavailableError(undefined, 'change') : error
  }
  return isObjectStoreUnavailable(error) ? objectStoreUnavailableError(error, during) : error
}

let memo: { key: string, store: ObjectStore } | undefined

/** The process-wide store from `runtimeConfig.s3` (made on first use; remade if settings change). */
export function useObjectStore(): ObjectStore {
  const settings = objectStoreSettingsFrom(useRuntimeConfig().s3 as Record<string, unknown> | undefined)
  const key = JSON.stringify(settings)
  if (!memo || memo.key !== key) memo = { key, store: createObjectStore(settings) }
  return memo.store
}
