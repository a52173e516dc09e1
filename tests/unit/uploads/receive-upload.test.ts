/**
 * receiveUpload (server/utils/uploads.ts) on hand-made requests: fields and one file streamed to
 * a fake store with size and SHA-256; 413 before reading when Content-Length is over the limit
 * and mid-stream without it (the store sees an error, never a complete file); 415 for the wrong
 * content type, a name ending off the list, or first bytes that do not match; 422 without a
 * file or with two; store failures passed through.
 */
import { createHash } from 'node:crypto'
import { Readable } from 'node:stream'
import { beforeAll, describe, expect, it } from 'vitest'
import { stubNitroGlobals, type FakeHttpError } from '../server/stub-nitro'
import { fileSignatureChecks, receiveUpload, type ReceiveUploadOptions, type UploadRequest, type UploadTypeRule } from '../../../server/utils/uploads'

beforeAll(() => stubNitroGlobals())

const types: UploadTypeRule[] = [
  { extension: '.csv', contentType: 'text/csv', label: 'CSV', sniff: fileSignatureChecks.text },
  { extension: '.pdf', contentType: 'application/pdf', label: 'PDF', sniff: fileSignatureChecks.pdf },
]

async function formRequest(build: (form: FormData) => void, headers: Record<string, string> = {}): Promise<UploadRequest> {
  const form = new FormData()
  build(form)
  const response = new Response(form)
  const body = Buffer.from(await response.arrayBuffer())
  const request = Readable.from([body]) as UploadRequest
  request.headers = { 'content-type': response.headers.get('content-type') ?? '', 'content-length': String(body.length), ...headers }
  return request
}

/** A store that collects the bytes, or fails when asked. */
function fakeStore(fail?: Error) {
  const received: { bytes: Buffer | null, error: unknown } = { bytes: null, error: null }
  const store: ReceiveUploadOptions['store'] = async (body) => {
    const chunks: Buffer[] = []
    try {
      for await (const chunk of body) {
        chunks.push(chunk as Buffer)
        if (fail) throw fail
      }
      received.bytes = Buffer.concat(chunks)
    } catch (error) {
      received.error = error
      throw error
    }
  }
  return { store, received }
}

async function statusOf(promise: Promise<unknown>): Promise<{ status: number, message: string }> {
  try {
    await promise
  } catch (error) {
    const failure = error as FakeHttpError
    return { status: failure.statusCode, message: failure.message }
  }
  throw new Error('expected a rejection')
}

const csv = 'id,L1_1,L1_2\nA,101,103\n'

describe('receiveUpload', () => {
  it('streams the file to the store and reports fields, cleaned name, size and SHA-256', async () => {
    const { store, received } = fakeStore()
    const request = await formRequest((form) => {
      form.append('markerType', 'microsatellite')
      form.append('ignored', 'x')
      form.append('file', new Blob([csv]), '../up/one.csv')
    })
    const result = await receiveUpload(request, { maxFileBytes: 1000, types, fieldNames: ['markerType'], keepContent: true, store })
    expect(result.fields).toEqual({ markerType: 'microsatellite' })
    expect(result.file).toMatchObject({ fileName: 'one.csv', extension: '.csv', contentType: 'text/csv', sizeBytes: csv.length })
    expect(result.file.sha256).toBe(createHash('sha256').update(csv).digest('hex'))
    expect(result.file.content?.toString()).toBe(csv)
    expect(received.bytes?.toString()).toBe(csv)
  })

  it('fields sent after the file are read too; content is not kept unless asked', async () => {
    const { store } = fakeStore()
    const request = await formRequest((form) => {
      form.append('file', new Blob([csv]), 'a.csv')
      form.append('markerType', 'snp')
    })
    const result = await receiveUpload(request, { maxFileBytes: 1000, types, fieldNames: ['markerType'], store })
    expect(result.fields.markerType).toBe('snp')
    expect(result.file.content).toBeUndefined()
  })

  it('413 at once when Content-Length is over the limit: nothing is read', async () => {
    const { store, received } = fakeStore()
    let read = false
    const request = new Readable({
      read() {
        read = true
        this.push(null)
      },
    }) as UploadRequest
    request.headers = { 'content-type': 'multipart/form-data; boundary=x', 'content-length': String(50 * 1024 * 1024) }
    const failure = await statusOf(receiveUpload(request, { maxFileBytes: 1024 * 1024, types, fieldNames: [], store }))
    expect(failure).toEqual({ status: 413, message: 'The file is too large. The limit is 1 MB.' })
    expect(read).toBe(false)
    expect(received.bytes).toBeNull()
  })

  it('413 mid-stream when there is no Content-Length; the store never gets a whole file', async () => {
    const { store, received } = fakeStore()
    const request = await formRequest(form => form.append('file', new Blob(['x'.repeat(5000)]), 'big.csv'))
    delete request.headers['content-length']
    const failure = await statusOf(receiveUpload(request, { maxFileBytes: 4096, types, fieldNames: [], store }))
    expect(failure.status).toBe(413)
    expect(received.bytes).toBeNull()
    expect(received.error).toBeTruthy()
  })

  it('exactly at the limit is accepted', async () => {
    const { store } = fakeStore()
    const request = await formRequest(form => form.append('file', new Blob(['y'.repeat(4096)]), 'edge.csv'))
    const result = await receiveUpload(request, { maxFileBytes: 4096, types, fieldNames: [], store })
    expect(result.file.sizeBytes).toBe(4096)
  })

  it('415 for another content type, an ending off the list, or bytes that do not match the ending', async () => {
    const { store } = fakeStore()
    const json = Readable.from(['{}']) as UploadRequest
    json.headers = { 'content-type': 'application/json' }
    expect((await statusOf(receiveUpload(json, { maxFileBytes: 10, types, fieldNames: [], store }))).status).toBe(415)
    const exe = await formRequest(form => form.append('file', new Blob(['MZ']), 'tool.exe'))
    expect(await statusOf(receiveUpload(exe, { maxFileBytes: 100, types, fieldNames: [], store }))).toEqual({ status: 415, message: 'Files ending in ".exe" are not accepted. Accepted: csv, pdf.' })
    const fakePdf = await formRequest(form => form.append('file', new Blob(['<html>']), 'report.pdf'))
    expect((await statusOf(receiveUpload(fakePdf, { maxFileBytes: 100, types, fieldNames: [], store }))).status).toBe(415)
    const binaryCsv = await formRequest(form => form.append('file', new Blob([new Uint8Array([65, 0, 66])]), 'data.csv'))
    expect((await statusOf(receiveUpload(binaryCsv, { maxFileBytes: 100, types, fieldNames: [], store }))).status).toBe(415)
  })

  it('422 without a file, with two files, or with an empty file', async () => {
    const { store } = fakeStore()
    const none = await formRequest(form => form.append('markerType', 'snp'))
    expect(await statusOf(receiveUpload(none, { maxFileBytes: 100, types, fieldNames: ['markerType'], store }))).toEqual({ status: 422, message: 'Choose a file to upload.' })
    const two = await formRequest((form) => {
      form.append('file', new Blob([csv]), 'a.csv')
      form.append('file', new Blob([csv]), 'b.csv')
    })
    expect((await statusOf(receiveUpload(two, { maxFileBytes: 1000, types, fieldNames: [], store }))).status).toBe(422)
    const empty = await formRequest(form => form.append('file', new Blob([]), 'a.csv'))
    expect(await statusOf(receiveUpload(empty, { maxFileBytes: 1000, types, fieldNames: [], store }))).toEqual({ status: 422, message: 'The file is empty.' })
  })

  it('a failing store fails the upload with its own error', async () => {
    const outage = Object.assign(new Error('connect ECONNREFUSED'), { code: 'ECONNREFUSED' })
    const { store } = fakeStore(outage)
    const request = await formRequest(form => form.append('file', new Blob([csv]), 'a.csv'))
    await expect(receiveUpload(request, { maxFileBytes: 1000, types, fieldNames: [], store })).rejects.toBe(outage)
  })
})
