/**
 * Reads a text request body (a CSV file sent as text/csv) with a size limit: a declared
 * Content-Length over the limit answers 413 before anything is read, and a body that grows past
 * the limit while streaming answers 413 as soon as it does (the rest is drained, not kept).
 */
import type { H3Event } from 'h3'
import { getRequestHeader, readRawBody } from 'h3'
import { payloadTooLarge } from '../utils/http-errors'

export async function readTextBody(event: H3Event, maxBytes: number): Promise<string> {
  const declared = Number.parseInt(String(getRequestHeader(event, 'content-length') ?? ''), 10)
  if (Number.isFinite(declared) && declared > maxBytes) throw payloadTooLarge(maxBytes)
  const request = event.node?.req
  if (!request || request.readableEnded || typeof request[Symbol.asyncIterator] !== 'function') {
    const raw = await readRawBody(event, false)
    if (raw && raw.length > maxBytes) throw payloadTooLarge(maxBytes)
    return raw ? raw.toString('utf8') : ''
  }
  const chunks: Buffer[] = []
  let total = 0
  for await (const chunk of request as AsyncIterable<Buffer | string>) {
    const buffer = typeof chunk === 'string' ? Buffer.from(chunk) : chunk
    total += buffer.length
    if (total > maxBytes) {
      request.resume()
      throw payloadTooLarge(maxBytes)
    }
    chunks.push(buffer)
  }
  return Buffer.concat(chunks).toString('utf8')
}
