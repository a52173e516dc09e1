/**
 * Reading and validating request input with zod, the one way every route does it:
 *
 *   const body = await readBodyWith(event, InviteUserSchema)
 *   const { id } = getParamsWith(event, RecordIdParamsSchema)
 *   const query = getQueryWith(event, OutboxQuerySchema)
 *
 * Answers (JSON through server/error.ts):
 * - 400 `{ message }` when the body is not JSON;
 * - 413 when the body is larger than `maxBytes` (1 MB unless the route says otherwise);
 * - 415 for form-encoded or multipart bodies (routes that take files read them themselves);
 * - 422 `{ message, issues: [{ path, message }] }` when the input breaks the schema. Messages are
 *   plain sentences: the schema's own message when it has one, else one from
 *   `humanIssueMessage` (not zod's developer wording).
 */
import type { H3Event } from 'h3'
import { z } from 'zod'

/** One problem with one input field; `path` is dotted ('items.0.name'), '' for the whole input. */
export interface InputIssue { path: string, message: string }

/** Largest JSON body accepted unless a route passes its own `maxBytes`. */
export const DEFAULT_MAX_BODY_BYTES = 1024 * 1024

/** Largest value of a PostgreSQL `integer` column (ids). */
const MAX_INTEGER_ID = 2_147_483_647

/** A record id in a route parameter: digits only, 1 … 2147483647. */
export const RecordIdSchema = z.string()
  .regex(/^\d{1,10}$/, 'Must be a record number, like 42.')
  .transform(Number)
  .pipe(z.number().int().min(1, 'Must be a record number, like 42.').max(MAX_INTEGER_ID, 'Must be a record number, like 42.'))

/** Route parameters `{ id }` of `/…/[id]` routes. */
export const RecordIdParamsSchema = z.object({ id: RecordIdSchema })

/** A 1-based page number in a query string (default 1, at most 100 000). */
export const PageNumberSchema = z.coerce.number({ error: 'Must be a page number, like 2.' })
  .int('Must be a whole page number, like 2.')
  .min(1, 'Pages start at 1.')
  .max(100_000, 'Must be at most 100000.')
  .default(1)

function plural(count: number | bigint, one: string, many: string): string {
  return `${count} ${Number(count) === 1 ? one : many}`
}

function describeType(value: unknown): string {
  if (value === null) return 'null'
  if (Array.isArray(value)) return 'a list'
  if (typeof value === 'number' && Number.isNaN(value)) return 'not a number'
  switch (typeof value) {
    case 'string': return 'text'
    case 'number': return 'a number'
    case 'boolean': return 'true/false'
    case 'object': return 'an object'
    default: return typeof value
  }
}

const EXPECTED_WORDS: Record<string, string> = {
  string: 'text',
  number: 'a number',
  int: 'a whole number',
  boolean: 'true or false',
  array: 'a list',
  object: 'an object',
  date: 'a date',
  bigint: 'a whole number',
  null: 'null',
}

const FORMAT_WORDS: Record<string, string> = {
  email: 'Enter a valid e-mail address.',
  url: 'Enter a full web address, like https://example.org.',
  uuid: 'Must be a UUID.',
  datetime: 'Must be a date and time, like 2025-03-01T12:00:00Z.',
  date: 'Must be a date, like 2025-03-01.',
  time: 'Must be a time, like 14:30.',
  regex: 'Is not in the expected format.',
}

/**
 * A plain-English sentence for a zod issue, used when the schema did not give its own message.
 * Returns undefined for codes it does not know, so zod's message is kept.
 *
 * @param issue - the raw issue zod hands to an error map
 * @returns the sentence, ending with a full stop, or undefined
 * @example humanIssueMessage({ code: 'too_small', origin: 'string', minimum: 10, input: 'abc', path: [] }) // 'Use at least 10 characters.'
 * @example humanIssueMessage({ code: 'invalid_type', expected: 'string', input: undefined, path: [] }) // 'This field is required.'
 */
export function humanIssueMessage(issue: z.core.$ZodRawIssue): string | undefined {
  switch (issue.code) {
    case 'invalid_type': {
      if (issue.input === undefined) return 'This field is required.'
      const expected = EXPECTED_WORDS[String(issue.expected)] ?? String(issue.expected)
      return `Must be ${expected}, not ${describeType(issue.input)}.`
    }
    case 'too_small': {
      const minimum = issue.minimum
      const exact = issue.exact === true
      if (issue.origin === 'string') {
        if (Number(minimum) === 1 && !exact) return 'Must not be empty.'
        return exact ? `Must be exactly ${plural(minimum, 'character', 'characters')}.` : `Use at least ${plural(minimum, 'character', 'characters')}.`
      }
      if (issue.origin === 'array' || issue.origin === 'set') {
        return exact ? `Must have exactly ${plural(minimum, 'item', 'items')}.` : `Must have at least ${plural(minimum, 'item', 'items')}.`
      }
      if (issue.origin === 'date') return `Must be on or after ${String(minimum)}.`
      return issue.inclusive === false ? `Must be greater than ${String(minimum)}.` : `Must be at least ${String(minimum)}.`
    }
    case 'too_big': {
      const maximum = issue.maximum
      const exact = issue.exact === true
      if (issue.origin === 'string') {
        return exact ? `Must be exactly ${plural(maximum, 'character', 'characters')}.` : `Use at most ${plural(maximum, 'character', 'characters')}.`
      }
      if (issue.origin === 'array' || issue.origin === 'set') {
        return exact ? `Must have exactly ${plural(maximum, 'item', 'items')}.` : `Must have at most ${plural(maximum, 'item', 'items')}.`
      }
      if (issue.origin === 'date') return `Must be on or before ${String(maximum)}.`
      return issue.inclusive === false ? `Must be less than ${String(maximum)}.` : `Must be at most ${String(maximum)}.`
    }
    case 'invalid_format':
      return FORMAT_WORDS[String(issue.format)] ?? `Must be a valid ${String(issue.format)}.`
    case 'invalid_value': {
      const values = issue.values.map(v => JSON.stringify(v))
      return values.length === 1 ? `Must be ${values[0]}.` : `Choose one of: ${values.join(', ')}.`
    }
    case 'not_multiple_of':
      return `Must be a multiple of ${String(issue.divisor)}.`
    case 'unrecognized_keys':
      return `Unknown ${issue.keys.length === 1 ? 'field' : 'fields'}: ${issue.keys.join(', ')}.`
    case 'invalid_union':
      return 'Is not one of the accepted forms.'
    case 'invalid_key':
      return 'Has a key that is not accepted.'
    case 'invalid_element':
      return 'Has a value that is not accepted.'
    default:
      return undefined
  }
}

/** Dotted path of an issue ('items.0.name'); '' for the whole input. */
export function issuePath(path: readonly PropertyKey[]): string {
  return path.map(part => (typeof part === 'symbol' ? part.description ?? '' : String(part))).join('.')
}

/** Turns a zod error into our `{ path, message }` list (same order as zod reports them). */
export function issuesFromZod(error: z.ZodError): InputIssue[] {
  return error.issues.map(issue => ({ path: issuePath(issue.path), message: issue.message }))
}

/**
 * The one-line `message` of a 422 answer: the first problem, and how many more there are.
 *
 * @example summariseIssues([{ path: 'email', message: 'Enter a valid e-mail address.' }]) // 'email: Enter a valid e-mail address.'
 * @example summariseIssues([]) // 'The request is not valid.'
 */
export function summariseIssues(issues: readonly InputIssue[], where = ''): string {
  const [first] = issues
  if (!first) return 'The request is not valid.'
  const prefix = where ? `${where}: ` : ''
  const head = `${prefix}${first.path ? `${first.path}: ` : ''}${first.message}`
  const rest = issues.length - 1
  return rest > 0 ? `${head} (and ${plural(rest, 'more problem', 'more problems')})` : head
}

/** Result of `checkInput`: the parsed value, or the 422 payload. */
export type InputCheck<T> = { ok: true, data: T } | { ok: false, message: string, issues: InputIssue[] }

/**
 * Validates any value against a schema with our messages, without throwing.
 *
 * @param schema - the zod schema
 * @param input - the decoded input
 * @param where - optional location words for the summary ('Query', 'Address')
 */
export function checkInput<S extends z.ZodType>(schema: S, input: unknown, where = ''): InputCheck<z.output<S>> {
  const result = schema.safeParse(input, { error: humanIssueMessage })
  if (result.success) return { ok: true, data: result.data }
  const issues = issuesFromZod(result.error)
  return { ok: false, message: summariseIssues(issues, where), issues }
}

function unprocessableInput(message: string, issues: InputIssue[]) {
  return createError({ status: 422, statusText: 'Unprocessable Content', message, data: { issues } })
}

/** Parses `input` or throws the 422 error. */
export function parseInputOrThrow<S extends z.ZodType>(schema: S, input: unknown, where = ''): z.output<S> {
  const checked = checkInput(schema, input, where)
  if (!checked.ok) throw unprocessableInput(checked.message, checked.issues)
  return checked.data
}

/**
 * Decodes a JSON request body: '' → `{}` (so each missing field is reported by the schema),
 * anything else must be valid JSON.
 *
 * @throws 400 with a readable message when the text is not JSON
 */
export function decodeJsonBody(text: string): unknown {
  if (text.trim() === '') return {}
  try {
    return JSON.parse(text)
  } catch (error) {
    const detail = error instanceof Error ? ` (${error.message})` : ''
    throw createError({ status: 400, statusText: 'Bad Request', message: `The request body is not valid JSON${detail}.` })
  }
}

async function readLimitedText(event: H3Event, maxBytes: number): Promise<string> {
  const declared = Number.parseInt(String(getRequestHeader(event, 'content-length') ?? ''), 10)
  if (Number.isFinite(declared) && declared > maxBytes) throw payloadTooLarge(maxBytes)
  const request = event.node?.req
  // Already read (or a runtime without a Node stream): let h3 hand over what it has.
  if (!request || request.readableEnded || typeof request[Symbol.asyncIterator] !== 'function') {
    const raw = await readRawBody(event, false)
    if (raw && raw.length > maxBytes) throw payloadTooLarge(maxBytes)
    return raw ? raw.toString('utf8') : ''
  }
  const chunks: Buffer[] = []
  let total = 0
  try {
    for await (const chunk of request as AsyncIterable<Buffer | string>) {
      const buffer = typeof chunk === 'string' ? Buffer.from(chunk) : chunk
      total += buffer.length
      if (total > maxBytes) {
        request.resume() // drain the rest so the 413 answer can be sent
        throw payloadTooLarge(maxBytes)
      }
      chunks.push(buffer)
    }
  } catch (error) {
    // Our own answers (the 413 above) go out as they are.
    if (error !== null && typeof error === 'object' && 'statusCode' in error) throw error
    // The client went away mid-body ("aborted", ECONNRESET): its fault, not the database's.
    throw createError({ status: 400, statusText: 'Bad Request', message: 'The request body was cut off before it arrived in full; send it again.' })
  }
  return Buffer.concat(chunks).toString('utf8')
}

/**
 * Reads the JSON body and validates it.
 *
 * @param event - the request
 * @param schema - zod schema of the body
 * @param options.maxBytes - largest body accepted (default 1 MB) → 413 beyond
 * @returns the parsed, transformed body
 */
export async function readBodyWith<S extends z.ZodType>(event: H3Event, schema: S, options: { maxBytes?: number } = {}): Promise<z.output<S>> {
  const contentType = String(getRequestHeader(event, 'content-type') ?? '').toLowerCase()
  if (contentType.startsWith('multipart/') || contentType.startsWith('application/x-www-form-urlencoded')) {
    throw createError({ status: 415, statusText: 'Unsupported Media Type', message: 'Send the request body as JSON (Content-Type: application/json).' })
  }
  const text = await readLimitedText(event, options.maxBytes ?? DEFAULT_MAX_BODY_BYTES)
  return parseInputOrThrow(schema, decodeJsonBody(text))
}

/** Validates the query string (values are strings or lists of strings; coerce in the schema). */
export function getQueryWith<S extends z.ZodType>(event: H3Event, schema: S): z.output<S> {
  return parseInputOrThrow(schema, getQuery(event), 'Query')
}

/** Validates the route parameters (decoded strings). */
export function getParamsWith<S extends z.ZodType>(event: H3Event, schema: S): z.output<S> {
  return parseInputOrThrow(schema, getRouterParams(event, { decode: true }), 'Address')
}
