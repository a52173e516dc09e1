/**
 * Reads the one file of a multipart/form-data request into memory, streamed with busboy and
 * bounded: 413 as soon as the file (or the declared request size) passes the limit, without
 * reading the rest. Used by the public verify route, which must look at every byte of the
 * uploaded PDF, so the limit is small (briefs are a few hundred KB).
 *
 * Answers: 415 when the request is not multipart/form-data, 422 when no file was sent (or
 * more than one), 413 past the limit.
 */
import type { IncomingHttpHeaders } from 'node:http'
import type { Readable } from 'node:stream'
import busboy from 'busboy'
import { createError } from 'h3'
import { formatBytes } from '../utils/http-errors'

/** Multipart framing and small text fields on top of the file. */
const FRAMING_BYTES = 64 * 1024

function tooLarge(maxBytes: number) {
  // formatBytes: a 64 KB limit reads "64 KB", not "0.1 MB"
  return createError({ status: 413, statusText: 'Payload Too Large', message: `The file is too large. The limit is ${formatBytes(maxBytes)}.` })
}

function unprocessable(message: string) {
  return createError({ status: 422, statusText: 'Unprocessable Content', message, data: { issues: [{ path: 'file', message }] } })
}

/** What was received. */
export interface UploadedFile {
  fileName: string
  content: Buffer
  /** Text fields by name (only those asked for). */
  fields: Record<string, string>
}

/**
 * Reads one file (form field `file`) and the named text fields.
 *
 * @param request - the Node request (`event.node.req`)
 * @param options.maxBytes - largest file accepted
 * @param options.fieldNames - text fields to keep
 */
export function readSingleUpload(request: Readable & { headers: IncomingHttpHeaders }, options: { maxBytes: number, fieldNames?: readonly string[] }): Promise<UploadedFile> {
  const contentType = String(request.headers['content-type'] ?? '').toLowerCase()
  if (!contentType.startsWith('multipart/form-data')) {
    return Promise.reject(createError({ status: 415, statusText: 'Unsupported Media Type', message: 'Send the file as multipart/form-data (a form with a field named "file").' }))
  }
  const declared = Number.parseInt(String(request.headers['content-length'] ?? ''), 10)
  if (Number.isFinite(declared) && declared > options.maxBytes + FRAMING_BYTES) {
    request.resume()
    return Promise.reject(tooLarge(options.maxBytes))
  }
  return new Promise<UploadedFile>((resolve, reject) => {
    let parser: busboy.Busboy
    try {
      parser = busboy({ headers: request.headers, defParamCharset: 'utf8', limits: { files: 1, fileSize: options.maxBytes + 1, fields: 10, fieldSize: 4096, parts: 20 } })
    } catch {
      reject(createError({ status: 415, statusText: 'Unsupported Media Type', message: 'The multipart form could not be read (missing boundary).' }))
      return
    }
    const fields: Record<string, string> = {}
    const chunks: Buffer[] = []
    let size = 0
    let fileName = ''
    let seen = false
    let settled = false
    const fail = (error: unknown) => {
      if (settled) return
      settled = true
      request.unpipe(parser)
      request.resume()
      reject(error)
    }
    parser.on('field', (name, text) => {
      if (options.fieldNames?.includes(name)) fields[name] = text
    })
    parser.on('file', (name, stream, info) => {
      if (name !== 'file' || seen) {
        stream.resume()
        if (name === 'file') fail(unprocessable('Send one file at a time.'))
        return
      }
      seen = true
      fileName = info.filename ?? ''
      stream.on('data', (chunk: Buffer) => {
        size += chunk.length
        if (size > options.maxBytes) {
          stream.resume()
          fail(tooLarge(options.maxBytes))
          return
        }
        chunks.push(chunk)
      })
      stream.on('limit', () => fail(tooLarge(options.maxBytes)))
    })
    parser.on('filesLimit', () => fail(unprocessable('Send one file at a time.')))
    parser.on('error', () => fail(unprocessable('The multipart form is malformed.')))
    parser.on('close', () => {
      if (settled) return
      if (!seen) return fail(unprocessable('Choose a file to upload.'))
      if (size === 0) return fail(unprocessable('The file is empty.'))
      settled = true
      resolve({ fileName, content: Buffer.concat(chunks), fields })
    })
    request.on('aborted', () => fail(unprocessable('The upload was interrupted.')))
    request.pipe(parser)
  })
}
