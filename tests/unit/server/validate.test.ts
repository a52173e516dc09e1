/**
 * server/utils/validate.ts: our zod messages, the 422 summary, JSON decoding (400), body size
 * limit (413) and the readBodyWith / getQueryWith / getParamsWith wrappers on a fake event.
 */
import { Readable } from 'node:stream'
import { beforeAll, describe, expect, it } from 'vitest'
import { z } from 'zod'
import { stubNitroGlobals, type FakeHttpError } from './stub-nitro'
import {
  checkInput, decodeJsonBody, getParamsWith, getQueryWith, humanIssueMessage, readBodyWith,
  RecordIdParamsSchema, summariseIssues,
} from '../../../server/utils/validate'
import { LoginSchema } from '../../../shared/schemas/auth'

interface FakeEvent { headers: Record<string, string>, body?: string, query?: Record<string, unknown>, params?: Record<string, string> }

function fakeEvent(spec: FakeEvent) {
  const req = Readable.from(spec.body === undefined ? [] : [Buffer.from(spec.body)]) as Readable & { headers: Record<string, string> }
  req.headers = spec.headers
  return { node: { req }, spec } as never
}

beforeAll(() => {
  stubNitroGlobals({
    getRequestHeader: (event: { spec: FakeEvent }, name: string) => event.spec.headers[name.toLowerCase()],
    getQuery: (event: { spec: FakeEvent }) => event.spec.query ?? {},
    getRouterParams: (event: { spec: FakeEvent }) => event.spec.params ?? {},
    payloadTooLarge: (limit: number) => Object.assign(new Error(`too large ${limit}`), { statusCode: 413 }),
    readRawBody: async () => undefined,
  })
})

async function caught(promise: Promise<unknown> | (() => unknown)): Promise<FakeHttpError> {
  try {
    if (typeof promise === 'function') promise()
    else await promise
  } catch (error) {
    return error as FakeHttpError
  }
  throw new Error('expected an error')
}

describe('humanIssueMessage', () => {
  it('says a missing field is required and names wrong types in words', () => {
    const schema = z.object({ name: z.string(), count: z.number(), tags: z.array(z.string()) })
    const result = checkInput(schema, { count: 'three', tags: {} })
    expect(result.ok).toBe(false)
    if (result.ok) return
    expect(result.issues).toEqual([
      { path: 'name', message: 'This field is required.' },
      { path: 'count', message: 'Must be a number, not text.' },
      { path: 'tags', message: 'Must be a list, not an object.' },
    ])
  })

  it('words length limits for text, numbers and lists', () => {
    const schema = z.object({ s: z.string().min(3).max(5), n: z.number().max(10), e: z.string().min(1), l: z.array(z.number()).max(1) })
    const result = checkInput(schema, { s: 'toolong', n: 11, e: '', l: [1, 2] })
    expect(result.ok ? [] : result.issues.map(i => i.message)).toEqual([
      'Use at most 5 characters.', 'Must be at most 10.', 'Must not be empty.', 'Must have at most 1 item.',
    ])
  })

  it('lists the choices of an enum and keeps the schema\'s own message first', () => {
    const schema = z.object({ role: z.enum(['a', 'b']), email: z.email('Own message.') })
    const result = checkInput(schema, { role: 'c', email: 'nope' })
    expect(result.ok ? [] : result.issues.map(i => i.message)).toEqual(['Choose one of: "a", "b".', 'Own message.'])
  })

  it('returns undefined for codes it does not know (zod keeps its own words)', () => {
    expect(humanIssueMessage({ code: 'custom', path: [], input: 1 } as never)).toBeUndefined()
  })
})

describe('summariseIssues', () => {
  it('names the first problem and counts the others', () => {
    expect(summariseIssues([{ path: 'email', message: 'Enter a valid e-mail address.' }])).toBe('email: Enter a valid e-mail address.')
    expect(summariseIssues([{ path: 'a', message: 'X.' }, { path: 'b', message: 'Y.' }, { path: '', message: 'Z.' }], 'Query'))
      .toBe('Query: a: X. (and 2 more problems)')
    expect(summariseIssues([])).toBe('The request is not valid.')
  })
})

describe('decodeJsonBody', () => {
  it('treats an empty body as an empty object so each missing field is reported', () => {
    expect(decodeJsonBody('')).toEqual({})
    expect(decodeJsonBody('  \n')).toEqual({})
  })
  it('answers 400 with a readable message for text that is not JSON', async () => {
    const error = await caught(() => decodeJsonBody('{"email": '))
    expect(error.statusCode).toBe(400)
    expect(error.message).toMatch(/^The request body is not valid JSON/)
  })
})

describe('readBodyWith', () => {
  it('parses, trims and lowercases through the schema', async () => {
    const event = fakeEvent({ headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: '  Ada@Example.ORG ', password: 'x' }) })
    await expect(readBodyWith(event, LoginSchema)).resolves.toEqual({ email: 'ada@example.org', password: 'x' })
  })

  it('answers 422 with issues for a body that breaks the schema', async () => {
    const event = fakeEvent({ headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 42 }) })
    const error = await caught(readBodyWith(event, LoginSchema))
    expect(error.statusCode).toBe(422)
    expect(error.data).toEqual({ issues: [
      { path: 'email', message: 'Enter an e-mail address.' },
      { path: 'password', message: 'Enter your password.' },
    ] })
    expect(error.message).toBe('email: Enter an e-mail address. (and 1 more problem)')
  })

  it('answers 400 for malformed JSON even when the client says text/plain', async () => {
    const event = fakeEvent({ headers: { 'content-type': 'text/plain' }, body: '{bad json' })
    expect((await caught(readBodyWith(event, LoginSchema))).statusCode).toBe(400)
  })

  it('answers 413 when the declared or actual size is over the limit', async () => {
    const declared = fakeEvent({ headers: { 'content-length': '5000' }, body: 'x' })
    expect((await caught(readBodyWith(declared, LoginSchema, { maxBytes: 100 }))).statusCode).toBe(413)
    const streamed = fakeEvent({ headers: {}, body: JSON.stringify({ email: 'a@b.cd', password: 'p'.repeat(500) }) })
    expect((await caught(readBodyWith(streamed, LoginSchema, { maxBytes: 100 }))).statusCode).toBe(413)
  })

  it('answers 415 for form posts', async () => {
    const event = fakeEvent({ headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: 'email=a' })
    expect((await caught(readBodyWith(event, LoginSchema))).statusCode).toBe(415)
  })
})

describe('getParamsWith and getQueryWith', () => {
  it('accepts record ids 1 … 2147483647 and refuses everything else with 422', async () => {
    expect(getParamsWith(fakeEvent({ headers: {}, params: { id: '42' } }), RecordIdParamsSchema)).toEqual({ id: 42 })
    expect(getParamsWith(fakeEvent({ headers: {}, params: { id: '2147483647' } }), RecordIdParamsSchema)).toEqual({ id: 2147483647 })
    for (const id of ['0', '-1', 'abc', '1.5', '2147483648', '99999999999', '']) {
      const error = await caught(() => getParamsWith(fakeEvent({ headers: {}, params: { id } }), RecordIdParamsSchema))
      expect(error.statusCode, id).toBe(422)
      expect(error.message).toBe('Address: id: Must be a record number, like 42.')
    }
  })

  it('validates the query string', async () => {
    const schema = z.object({ page: z.coerce.number().int().min(1) })
    expect(getQueryWith(fakeEvent({ headers: {}, query: { page: '3' } }), schema)).toEqual({ page: 3 })
    const error = await caught(() => getQueryWith(fakeEvent({ headers: {}, query: { page: '0' } }), schema))
    expect(error.statusCode).toBe(422)
    expect(error.message).toBe('Query: page: Must be at least 1.')
  })
})
