/**
 * Small constructors for the HTTP errors routes throw, so every message reads the same way.
 * Each returns the error (write `throw notFound('User')`) so TypeScript sees the throw.
 * The JSON body is `{ message }` (server/error.ts formats it).
 */
import { LARGEST_BODY_REQUEST_BYTES, LARGEST_UPLOAD_REQUEST_BYTES, MULTIPART_OVERHEAD_BYTES } from '#shared/schemas/request-limits'
import { DB_UNAVAILABLE_MESSAGE, isDbUnavailable } from '../db/connection'
import type { InputIssue } from './validate'

/** The error object h3's `createError` makes (h3 is auto-imported in server code). */
type HttpError = ReturnType<typeof createError>

/** 404: the record does not exist or belongs to another agency (never say which). */
export function notFound(what: string): HttpError {
  return createError({ status: 404, statusText: 'Not Found', message: `${what} not found.` })
}

/** 403: signed in, but not allowed to do this. */
export function forbidden(message: string): HttpError {
  return createError({ status: 403, statusText: 'Forbidden', message })
}

/** 401: not signed in, or the session ended. */
export function unauthorized(message = 'Please sign in.'): HttpError {
  return createError({ status: 401, statusText: 'Unauthorized', message })
}

/** 409: the request conflicts with the current state (an edit since it was loaded, a duplicate). */
export function conflict(message: string): HttpError {
  return createError({ status: 409, statusText: 'Conflict', message })
}

/** 410: a one-time link that was valid once (used or expired). */
export function gone(message: string): HttpError {
  return createError({ status: 410, statusText: 'Gone', message })
}

/** 413: the request body is larger than this route accepts. */
export function payloadTooLarge(limitBytes?: number): HttpError {
  const limit = limitBytes === undefined ? '' : ` The limit is ${formatBytes(limitBytes)}.`
  return createError({ status: 413, statusText: 'Payload Too Large', message: `The request is too large.${limit}` })
}

/** 422: well-formed, but not acceptable (a rule on the values, not their shape). */
export function unprocessable(message: string, issues?: InputIssue[]): HttpError {
  return createError({ status: 422, statusText: 'Unprocessable Content', message, data: issues ? { issues } : undefined })
}

/** 429: too many attempts; `retryAfterSeconds` goes into the Retry-After header by server/error.ts. */
export function tooManyRequests(message: string, retryAfterSeconds: number): HttpError {
  return createError({ status: 429, statusText: 'Too Many Requests', message, data: { retryAfterSeconds } })
}

/** Byte count for people: '1 MB', '512 KB', '900 bytes'. */
export function formatBytes(bytes: number): string {
  if (bytes >= 1024 * 1024) return `${Math.round((bytes / (1024 * 1024)) * 10) / 10} MB`
  if (bytes >= 1024) return `${Math.round(bytes / 1024)} KB`
  return `${bytes} bytes`
}

/** What server/error.ts sends for an error: status, JSON body and whether to log it as a fault. */
export interface ErrorAnswer {
  status: number
  statusText: string
  message: string
  issues?: InputIssue[]
  retryAfterSeconds?: number
  /** True for faults (bugs, unexpected states): log the whole error, answer without details. */
  unexpected: boolean
}

/** The message of every 500 answer: says what to do, reveals nothing about the cause. */
export const UNEXPECTED_ERROR_MESSAGE = 'Something went wrong on our side. Please try again; if it keeps happening, tell your administrator.'

const STATUS_TEXT: Record<number, string> = {
  400: 'Bad Request', 401: 'Unauthorized', 403: 'Forbidden', 404: 'Not Found', 405: 'Method Not Allowed',
  409: 'Conflict', 410: 'Gone', 413: 'Payload Too Large', 415: 'Unsupported Media Type',
  422: 'Unprocessable Content', 429: 'Too Many Requests', 500: 'Internal Server Error', 503: 'Service Unavailable',
}

/** The error and what it wraps (h3 `cause`, Sequelize `parent`/`original`), at most 6 deep. */
export function errorChain(error: unknown): Record<string, unknown>[] {
  const chain: Record<string, unknown>[] = []
  let current: unknown = error
  while (current !== null && typeof current === 'object' && chain.length < 6 && !chain.includes(current as Record<string, unknown>)) {
    const record = current as Record<string, unknown>
    chain.push(record)
    current = record.cause ?? record.parent ?? record.original
  }
  return chain
}

function fromName(chain: Record<string, unknown>[], name: string): boolean {
  return chain.some(entry => entry.name === name)
}

/**
 * Decides the HTTP answer for any error a handler threw: h3 errors keep their status and
 * message; known database conditions get a status of their own; everything else is a 500 with
 * a plain message (and is logged by the caller).
 *
 * @example answerForError(notFound('User')).status // 404
 * @example answerForError(new Error('boom')).message // UNEXPECTED_ERROR_MESSAGE
 */
/** The 413 message for a body over the app-wide ceiling, before any route has read it. */
const REQUEST_CEILING_MESSAGE = `The request is too large. Files can be at most ${formatBytes(LARGEST_UPLOAD_REQUEST_BYTES - MULTIPART_OVERHEAD_BYTES)} (each kind of file has its own, lower limit), other requests at most ${formatBytes(LARGEST_BODY_REQUEST_BYTES)}.`

export function answerForError(error: unknown): ErrorAnswer {
  const chain = errorChain(error)
  const answer = (status: number, message: string, unexpected = false): ErrorAnswer =>
    ({ status, statusText: STATUS_TEXT[status] ?? 'Error', message, unexpected })

  if (isDbUnavailable(error)) return answer(503, DB_UNAVAILABLE_MESSAGE)
  if (fromName(chain, 'SequelizeOptimisticLockError')) {
    return answer(409, 'Someone else changed this record since you loaded it. Reload it and try again.')
  }
  if (fromName(chain, 'SequelizeUniqueConstraintError')) return answer(409, 'This would duplicate a record that already exists.')

  const top = chain[0] ?? {}
  const status = Number(top.statusCode ?? top.status)
  const deliberate = Number.isInteger(status) && status >= 400 && status <= 599 && top.unhandled !== true
  if (!deliberate) return answer(500, UNEXPECTED_ERROR_MESSAGE, true)

  const data = (top.data ?? {}) as { issues?: unknown, retryAfterSeconds?: unknown }
  let message = typeof top.message === 'string' && top.message.trim() !== '' ? top.message : (STATUS_TEXT[status] ?? 'Error')
  if (status === 404 && /^Page not found/i.test(message)) message = 'There is no such API route.'
  // nuxt-security's size ceiling (nuxt.config.ts) answers with the bare status text.
  if (status === 413 && message === STATUS_TEXT[413]) message = REQUEST_CEILING_MESSAGE
  const result = answer(status, message, status >= 500 && status !== 503)
  if (result.unexpected) result.message = UNEXPECTED_ERROR_MESSAGE
  if (Array.isArray(data.issues)) result.issues = data.issues as InputIssue[]
  if (typeof data.retryAfterSeconds === 'number') result.retryAfterSeconds = data.retryAfterSeconds
  return result
}
