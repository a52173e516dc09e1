/**
 * Streaming file uploads (multipart/form-data, one file per request) with busboy: the file is
 * passed on to a `store` callback (object storage) as it arrives, never read whole into memory
 * unless the route asks to keep it (genotype tables, which must be parsed, bounded by the limit).
 *
 *   const upload = await receiveUpload(event.node.req, {
 *     maxFileBytes: ATTACHMENT_MAX_BYTES, types: attachmentRules, fieldNames: [],
 *     store: (body, file) => objectStore.putStream(key, body, { contentType: file.contentType }).done,
 *   })
 *
 * Answers (thrown as h3 errors, JSON through server/error.ts):
 * - 413 before reading anything when Content-Length already exceeds the limit, and as soon as
 *   the file passes the limit while streaming (the upload is aborted, the rest of the request
 *   is discarded unread);
 * - 415 for a request that is not multipart/form-data, and for a file whose name ending is not
 *   on the allow-list or whose first bytes do not match that type;
 * - 422 when no file was sent, more than one file was sent, or the name is unusable.
 * While streaming, the SHA-256 and the size are computed. File names are cleaned of path parts
 * and control characters (`sanitizeFileName`); storage keys never contain them.
 */
import { createHash } from 'node:crypto'
import type { IncomingHttpHeaders } from 'node:http'
import { Transform, type Readable, type TransformCallback } from 'node:stream'
import busboy from 'busboy'
import { MULTIPART_OVERHEAD_BYTES } from '#shared/schemas/request-limits'

/** Bytes of the file start kept for type checks. */
const HEAD_BYTES = 4096

/** One accepted file type: its name ending, the content type stored, and a check of its first bytes. */
export interface UploadTypeRule {
  /** lower-case ending with the dot, e.g. '.pdf' */
  extension: string
  contentType: string
  label: string
  /** true when the first bytes (up to 4 KB, fewer for a short file) fit the type */
  sniff: (head: Buffer) => boolean
}

/** What the request carried, after it was read and stored. */
export interface ReceivedUpload {
  /** text fields by name (only the names the route allowed) */
  fields: Record<string, string>
  file: {
    /** cleaned name, safe to show and to put in Content-Disposition */
    fileName: string
    /** the name as the browser sent it */
    originalName: string
    extension: string
    contentType: string
    label: string
    sizeBytes: number
    sha256: string
    /** the whole file, only with `keepContent` */
    content?: Buffer
  }
}

export interface ReceiveUploadOptions {
  /** form field that carries the file (default 'file') */
  fileField?: string
  maxFileBytes: number
  types: readonly UploadTypeRule[]
  /** text fields accepted; others are ignored */
  fieldNames: readonly string[]
  /** keep the bytes in memory for the route (bounded by `maxFileBytes`) */
  keepContent?: boolean
  /** receives the file stream once its type is known; resolves when stored */
  store: (body: Readable, file: { fileName: string, extension: string, contentType: string }) => Promise<void>
}

/** The request as this module needs it (an IncomingMessage). */
export type UploadRequest = Readable & { headers: IncomingHttpHeaders }

type HttpError = ReturnType<typeof createError>

/** Byte count for people: '20 MB', '512 KB'. */
function bytesText(bytes: number): string {
  if (bytes >= 1024 * 1024) return `${Math.round((bytes / (1024 * 1024)) * 10) / 10} MB`
  if (bytes >= 1024) return `${Math.round(bytes / 1024)} KB`
  return `${bytes} bytes`
}

/** 413 for a file over `maxBytes`. */
export function uploadTooLarge(maxBytes: number): HttpError {
  return createError({ status: 413, statusText: 'Payload Too Large', message: `The file is too large. The limit is ${bytesText(maxBytes)}.` })
}

function unsupportedType(message: string): HttpError {
  return createError({ status: 415, statusText: 'Unsupported Media Type', message })
}

function unprocessableFile(message: string): HttpError {
  return createError({ status: 422, statusText: 'Unprocessable Content', message, data: { issues: [{ path: 'file', message }] } })
}

const WINDOWS_RESERVED = /^(con|prn|aux|nul|com\d|lpt\d)$/i

/**
 * Invisible characters that change how a name reads: bidirectional overrides and isolates
 * ('\u202Egpj.exe' shows as 'exe.jpg'), marks, zero-width spaces and joiners, byte-order marks.
 */
const INVISIBLE_FORMATTING = /[\u00AD\u061C\u180E\u200B-\u200F\u202A-\u202E\u2060-\u2069\uFEFF]/g

/** The first `max` characters of `text`, never cutting a character in two (counted in UTF-16 units, like String.length). */
function leadingUnits(text: string, max: number): string {
  let kept = ''
  for (const character of text) {
    if (kept.length + character.length > max) break
    kept += character
  }
  return kept
}

/**
 * A file name safe to show, store and send back: the last path part only (both / and \),
 * no control, quote, reserved or invisible formatting characters, no leading dots or spaces,
 * at most 120 characters with the ending kept (never cutting a character in two). Unicode is
 * normalised (NFC). Empty results become `fallback`.
 *
 * @example sanitizeFileName('../../etc/passwd')          // 'passwd'
 * @example sanitizeFileName('C:\\Users\\a\\permit.pdf')  // 'permit.pdf'
 * @example sanitizeFileName('..')                        // 'file'
 * @example sanitizeFileName('rapport\u0000.pdf')         // 'rapport.pdf'
 * @example sanitizeFileName('\u202Egpj.exe')            // 'gpj.exe' (no longer shown as "exe.jpg")
 */
export function sanitizeFileName(name: string, fallback = 'file'): string {
  const lastPart = name.normalize('NFC').split(/[/\\]/).pop() ?? ''
  let cleaned = lastPart
    // eslint-disable-next-line no-control-regex -- control characters are exactly what must go
    .replace(/[\u0000-\u001F\u007F-\u009F]/g, '')
    .replace(INVISIBLE_FORMATTING, '')
    // a half of a surrogate pair on its own is not a character (the database would store U+FFFD)
    .replace(/[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g, '')
    .replace(/[<>:"|?*]/g, '_')
    .replace(/\s+/g, ' ')
    .replace(/^[\s.]+/, '')
    .replace(/[\s.]+$/, '')
  const dot = cleaned.lastIndexOf('.')
  const stem = dot > 0 ? cleaned.slice(0, dot) : cleaned
  const ending = dot > 0 ? cleaned.slice(dot) : ''
  if (WINDOWS_RESERVED.test(stem)) cleaned = `_${cleaned}`
  if (cleaned.length > 120) {
    const keptEnding = ending.length <= 12 ? ending : ''
    cleaned = `${leadingUnits(cleaned, 120 - keptEnding.length).trimEnd()}${keptEnding}`
  }
  return cleaned === '' ? fallback : cleaned
}

/** Lower-case name ending with its dot ('.pdf'), '' when there is none. */
export function fileNameExtension(fileName: string): string {
  const match = /\.[^.\s]+$/.exec(fileName)
  return match ? match[0].toLowerCase() : ''
}

/** First-bytes checks for the common types. */
export const fileSignatureChecks = {
  pdf: (head: Buffer) => head.subarray(0, 5).toString('latin1') === '%PDF-',
  png: (head: Buffer) => head.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A])),
  jpeg: (head: Buffer) => head.length >= 3 && head[0] === 0xFF && head[1] === 0xD8 && head[2] === 0xFF,
  /** Office Open XML files (docx, xlsx) are zip archives */
  zip: (head: Buffer) => head.subarray(0, 4).equals(Buffer.from([0x50, 0x4B, 0x03, 0x04])),
  /** text: no NUL byte in the first bytes */
  text: (head: Buffer) => !head.includes(0),
} as const

/**
 * Measures, hashes and inspects the file as it passes: holds back the first bytes until the
 * type check has run, fails past the size limit, keeps the bytes when asked.
 */
class InspectingStream extends Transform {
  sizeBytes = 0
  private readonly hash = createHash('sha256')
  private head: Buffer[] = []
  private headLength = 0
  private checked = false
  readonly kept: Buffer[] = []

  constructor(private readonly maxBytes: number, private readonly check: (head: Buffer) => HttpError | null, private readonly keep: boolean) {
    super()
  }

  get sha256(): string {
    return this.hash.digest('hex')
  }

  private release(callback: TransformCallback): void {
    this.checked = true
    const head = Buffer.concat(this.head)
    this.head = []
    const problem = this.check(head)
    if (problem) return callback(problem)
    if (head.length > 0) this.push(head)
    callback()
  }

  override _transform(chunk: Buffer, _encoding: BufferEncoding, callback: TransformCallback): void {
    this.sizeBytes += chunk.length
    if (this.sizeBytes > this.maxBytes) return callback(uploadTooLarge(this.maxBytes))
    this.hash.update(chunk)
    if (this.keep) this.kept.push(chunk)
    if (this.checked) {
      this.push(chunk)
      return callback()
    }
    this.head.push(chunk)
    this.headLength += chunk.length
    if (this.headLength >= HEAD_BYTES) return this.release(callback)
    callback()
  }

  override _flush(callback: TransformCallback): void {
    if (!this.checked) return this.release(callback)
    callback()
  }
}

function typeProblem(rule: UploadTypeRule): (head: Buffer) => HttpError | null {
  return (head) => {
    if (head.length === 0) return unprocessableFile('The file is empty.')
    return rule.sniff(head) ? null : unsupportedType(`The file's contents do not look like a ${rule.label} file, although its name ends in ${rule.extension}.`)
  }
}

/**
 * Reads a multipart request: text fields, and one file streamed to `options.store`.
 *
 * @param request - the Node request (`event.node.req`)
 * @param options - limits, accepted types and fields, where the file goes
 * @returns the fields and the stored file's cleaned name, type, size and SHA-256
 * @throws 413 / 415 / 422 h3 errors as described above; errors from `store` unchanged
 */
export function receiveUpload(request: UploadRequest, options: ReceiveUploadOptions): Promise<ReceivedUpload> {
  const fileField = options.fileField ?? 'file'
  const headers = request.headers
  const contentType = String(headers['content-type'] ?? '').toLowerCase()
  if (!contentType.startsWith('multipart/form-data')) {
    return Promise.reject(unsupportedType('Send the file as multipart/form-data (a form with a file field).'))
  }
  const declared = Number.parseInt(String(headers['content-length'] ?? ''), 10)
  if (Number.isFinite(declared) && declared > options.maxFileBytes + MULTIPART_OVERHEAD_BYTES) {
    return Promise.reject(uploadTooLarge(options.maxFileBytes))
  }

  return new Promise<ReceivedUpload>((resolve, reject) => {
    const fields: Record<string, string> = {}
    let parser: busboy.Busboy
    try {
      parser = busboy({
        headers,
        defParamCharset: 'utf8',
        limits: { files: 1, fileSize: options.maxFileBytes + 1, fields: 20, fieldSize: 4096, parts: 40, headerPairs: 100 },
      })
    } catch {
      reject(unsupportedType('The multipart form could not be read (missing boundary).'))
      return
    }

    let settled = false
    let fileSeen = false
    let stored: Promise<void> | null = null
    let inspector: InspectingStream | null = null
    let file: Omit<ReceivedUpload['file'], 'sizeBytes' | 'sha256' | 'content'> | null = null

    /** Stops reading: the rest of the request is discarded, the store is given up, the error goes out. */
    const fail = (error: unknown) => {
      if (settled) return
      settled = true
      request.unpipe(parser)
      request.resume()
      inspector?.destroy(error instanceof Error ? error : new Error(String(error)))
      // Let an interrupted store finish aborting (so the caller's clean-up comes after it), but never wait long.
      const giveUp = new Promise<void>(resolve => setTimeout(resolve, 10_000).unref())
      const after = stored ? Promise.race([stored.catch(() => undefined), giveUp]) : Promise.resolve()
      void after.then(() => reject(error))
    }

    parser.on('field', (name, value, info) => {
      if (info.valueTruncated) return fail(unprocessableFile(`The form field "${name}" is too long.`))
      if (options.fieldNames.includes(name)) fields[name] = value
    })
    parser.on('filesLimit', () => fail(unprocessableFile('Send one file at a time.')))
    parser.on('partsLimit', () => fail(unprocessableFile('The form has too many parts.')))
    parser.on('fieldsLimit', () => fail(unprocessableFile('The form has too many fields.')))

    parser.on('file', (name, stream, info) => {
      if (settled || name !== fileField || fileSeen) {
        stream.resume()
        if (!settled && name === fileField) fail(unprocessableFile('Send one file at a time.'))
        return
      }
      fileSeen = true
      const originalName = info.filename ?? ''
      const fileName = sanitizeFileName(originalName)
      const extension = fileNameExtension(fileName)
      const rule = options.types.find(type => type.extension === extension)
      if (!rule) {
        stream.resume()
        const accepted = options.types.map(type => type.extension.slice(1)).join(', ')
        return fail(unsupportedType(`Files ending in "${extension || '(no ending)'}" are not accepted. Accepted: ${accepted}.`))
      }
      file = { fileName, originalName, extension, contentType: rule.contentType, label: rule.label }
      const inspecting = new InspectingStream(options.maxFileBytes, typeProblem(rule), options.keepContent ?? false)
      inspector = inspecting
      stream.on('limit', () => fail(uploadTooLarge(options.maxFileBytes)))
      inspecting.on('error', fail)
      stream.pipe(inspecting)
      stored = Promise.resolve().then(() => options.store(inspecting, { fileName, extension, contentType: rule.contentType }))
      stored.catch((error: unknown) => {
        stream.unpipe(inspecting)
        stream.resume()
        fail(error)
      })
    })

    parser.on('error', () => fail(unprocessableFile('The multipart form is malformed.')))
    parser.on('close', () => {
      if (settled) return
      if (!fileSeen || !file || !inspector || !stored) return fail(unprocessableFile('Choose a file to upload.'))
      const received = file
      const done = inspector
      stored.then(() => {
        if (settled) return
        settled = true
        resolve({
          fields,
          file: {
            ...received,
            sizeBytes: done.sizeBytes,
            sha256: done.sha256,
            ...(options.keepContent ? { content: Buffer.concat(done.kept) } : {}),
          },
        })
      }, fail)
    })

    request.on('aborted', () => fail(unprocessableFile('The upload was interrupted.')))
    request.pipe(parser)
  })
}

/**
 * `receiveUpload` into object storage at `key`: checks first that storage answers (a clear 503
 * before any of the body is read), streams the file there, and removes the object again when
 * the upload fails part-way. Storage outages become the 503 answer.
 *
 * @returns what `receiveUpload` returns; the object is stored at `key`
 */
export async function receiveUploadIntoStorage(
  request: UploadRequest,
  key: string,
  options: Omit<ReceiveUploadOptions, 'store'>,
): Promise<ReceivedUpload> {
  const store = useObjectStore()
  try {
    await store.checkReachable()
  } catch (error) {
    throw asObjectStoreError(error)
  }
  let started = false
  try {
    return await receiveUpload(request, {
      ...options,
      store: (body, file) => {
        started = true
        return store.putStream(key, body, { contentType: file.contentType }).done
      },
    })
  } catch (error) {
    if (started) await discardStoredObject(key)
    throw asObjectStoreError(error)
  }
}

/** Removes an object whose record was not (or is no longer) written; logs instead of failing. */
export async function discardStoredObject(key: string): Promise<void> {
  try {
    await useObjectStore().remove(key)
  } catch (error) {
    console.warn(`[storage] could not remove ${key}; it is left over in the bucket:`, error instanceof Error ? error.message : error)
  }
}
