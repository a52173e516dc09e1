/**
 * Object-store helpers that need no server: settings from runtime config / environment
 * (text forms of flags and numbers, defaults for blanks), storage keys without user text, and
 * telling an outage (→ 503) from other errors.
 */
import { beforeAll, describe, expect, it, vi } from 'vitest'
import { stubNitroGlobals, type FakeHttpError } from '../server/stub-nitro'
import {
  DEFAULT_OBJECT_STORE_SETTINGS,
  OBJECT_STORE_UNAVAILABLE_MESSAGE,
  OBJECT_STORE_UNREADABLE_MESSAGE,
  asObjectStoreError,
  isMissingObject,
  isObjectStoreUnavailable,
  objectKey,
  objectStoreSettingsFrom,
  objectStoreSettingsFromEnv,
} from '../../../server/utils/storage'

describe('object store settings', () => {
  it('defaults for an empty config', () => {
    expect(objectStoreSettingsFrom(undefined)).toEqual(DEFAULT_OBJECT_STORE_SETTINGS)
    expect(objectStoreSettingsFrom({ endpoint: '  ', bucket: '' })).toEqual(DEFAULT_OBJECT_STORE_SETTINGS)
  })

  it('reads NUXT_S3_* text forms', () => {
    const settings = objectStoreSettingsFromEnv({
      NUXT_S3_ENDPOINT: 'https://s3.example.test', NUXT_S3_BUCKET: 'agency-files', NUXT_S3_FORCE_PATH_STYLE: 'false',
      NUXT_S3_DOWNLOAD_LINK_SECONDS: '60', NUXT_S3_PUBLIC_ENDPOINT: 'https://files.example.test',
    })
    expect(settings).toMatchObject({ endpoint: 'https://s3.example.test', bucket: 'agency-files', forcePathStyle: false, downloadLinkSeconds: 60, publicEndpoint: 'https://files.example.test' })
  })

  it('refuses link lifetimes outside 1 s … 7 days (falls back to the default)', () => {
    for (const value of ['0', '-5', '1.5', '604801', 'soon']) {
      expect(objectStoreSettingsFrom({ downloadLinkSeconds: value }).downloadLinkSeconds).toBe(300)
    }
    expect(objectStoreSettingsFrom({ downloadLinkSeconds: 604800 }).downloadLinkSeconds).toBe(604800)
  })
})

describe('objectKey', () => {
  it('is made of ids and a random part only', () => {
    const key = objectKey('attachments', 3, 12, '.pdf')
    expect(key).toMatch(/^attachments\/agency-3\/owner-12\/[0-9a-f-]{36}\.pdf$/)
    expect(objectKey('genotypes', 1, 2, '../../x')).toMatch(/^genotypes\/agency-1\/owner-2\/[0-9a-f-]{36}$/)
    expect(objectKey('genotypes', 1, 2, '')).not.toBe(objectKey('genotypes', 1, 2, ''))
  })
})

describe('isObjectStoreUnavailable', () => {
  it('recognises connection failures, time-outs, a missing bucket and 5xx answers', () => {
    expect(isObjectStoreUnavailable(Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:4569'), { code: 'ECONNREFUSED' }))).toBe(true)
    expect(isObjectStoreUnavailable({ name: 'TimeoutError' })).toBe(true)
    expect(isObjectStoreUnavailable({ name: 'NoSuchBucket' })).toBe(true)
    expect(isObjectStoreUnavailable({ name: 'InternalError', $metadata: { httpStatusCode: 500 } })).toBe(true)
    expect(isObjectStoreUnavailable({ name: 'Error', cause: { code: 'ECONNRESET' } })).toBe(true)
    expect(isObjectStoreUnavailable(new AggregateError([Object.assign(new Error('x'), { code: 'ECONNREFUSED' })]))).toBe(true)
  })
  it('leaves other errors alone', () => {
    expect(isObjectStoreUnavailable(new Error('boom'))).toBe(false)
    expect(isObjectStoreUnavailable({ name: 'NoSuchKey', $metadata: { httpStatusCode: 404 } })).toBe(false)
    expect(isObjectStoreUnavailable({ statusCode: 413 })).toBe(false)
    expect(isMissingObject({ name: 'NoSuchKey' })).toBe(true)
    expect(isMissingObject(new Error('boom'))).toBe(false)
  })
})

describe('asObjectStoreError', () => {
  beforeAll(() => {
    stubNitroGlobals()
    vi.spyOn(console, 'warn').mockImplementation(() => {})
  })
  const refused = () => Object.assign(new Error('connect ECONNREFUSED'), { code: 'ECONNREFUSED' })

  it('turns an outage into a 503 that says nothing was saved (or, when reading, that files cannot be read)', () => {
    const change = asObjectStoreError(refused()) as FakeHttpError
    expect(change.statusCode).toBe(503)
    expect(change.message).toBe(OBJECT_STORE_UNAVAILABLE_MESSAGE)
    expect((asObjectStoreError(refused(), 'read') as FakeHttpError).message).toBe(OBJECT_STORE_UNREADABLE_MESSAGE)
    // The outage is not attached as the cause: the error handler would read it as a database outage.
    expect((change as { cause?: unknown }).cause).toBeUndefined()
  })

  it('a failed read inside a change is reworded; other errors pass unchanged', () => {
    const read = asObjectStoreError(refused(), 'read')
    expect((asObjectStoreError(read) as FakeHttpError).message).toBe(OBJECT_STORE_UNAVAILABLE_MESSAGE)
    const other = new Error('boom')
    expect(asObjectStoreError(other)).toBe(other)
    const databaseDown = Object.assign(new Error('The database is not reachable right now; try again in a moment.'), { statusCode: 503 })
    expect(asObjectStoreError(databaseDown)).toBe(databaseDown)
  })
})
