/**
 * server/utils/http-errors.ts `answerForError`: what the API error handler sends for each kind
 * of failure, and that nothing internal leaks.
 */
import { describe, expect, it } from 'vitest'
import { ConnectionRefusedError, OptimisticLockError, UniqueConstraintError } from 'sequelize'
import { answerForError, formatBytes, UNEXPECTED_ERROR_MESSAGE } from '../../../server/utils/http-errors'

function h3Like(statusCode: number, message: string, extra: Record<string, unknown> = {}) {
  return Object.assign(new Error(message), { statusCode, ...extra })
}

describe('answerForError', () => {
  it('keeps status, message and issues of deliberate 4xx errors', () => {
    const issues = [{ path: 'email', message: 'Enter a valid e-mail address.' }]
    expect(answerForError(h3Like(422, 'email: Enter a valid e-mail address.', { data: { issues } })))
      .toEqual({ status: 422, statusText: 'Unprocessable Content', message: 'email: Enter a valid e-mail address.', issues, unexpected: false })
    expect(answerForError(h3Like(429, 'Wait.', { data: { retryAfterSeconds: 90 } }))).toMatchObject({ status: 429, retryAfterSeconds: 90 })
  })

  it('hides unexpected errors behind a plain 500 and flags them for the log', () => {
    const answer = answerForError(new TypeError('cannot read properties of undefined (reading "x") at /srv/app.js:1'))
    expect(answer).toEqual({ status: 500, statusText: 'Internal Server Error', message: UNEXPECTED_ERROR_MESSAGE, unexpected: true })
    // h3 wraps a thrown non-HTTP error as an unhandled 500 whose message is the original one.
    expect(answerForError(h3Like(500, 'relation "users" does not exist', { unhandled: true })).message).toBe(UNEXPECTED_ERROR_MESSAGE)
    expect(answerForError(h3Like(500, 'deliberate but internal')).message).toBe(UNEXPECTED_ERROR_MESSAGE)
  })

  it('answers 503 when the database cannot be reached, also when wrapped by h3', () => {
    const refused = new ConnectionRefusedError(Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:55432'), { code: 'ECONNREFUSED' }))
    expect(answerForError(refused).status).toBe(503)
    expect(answerForError(h3Like(500, 'x', { unhandled: true, cause: refused }))).toMatchObject({ status: 503, unexpected: false })
  })

  it('maps optimistic-lock and unique-constraint failures to 409', () => {
    expect(answerForError(new OptimisticLockError({ message: 'x', modelName: 'User', values: {}, where: {} })).status).toBe(409)
    expect(answerForError(h3Like(500, 'x', { unhandled: true, cause: new UniqueConstraintError({ message: 'dup' }) })).status).toBe(409)
  })

  it('rewrites Nuxt\'s page-not-found wording for API paths', () => {
    expect(answerForError(h3Like(404, 'Page not found: /api/nope')).message).toBe('There is no such API route.')
  })
})

describe('formatBytes', () => {
  it('prints sizes for people', () => {
    expect(formatBytes(900)).toBe('900 bytes')
    expect(formatBytes(16 * 1024)).toBe('16 KB')
    expect(formatBytes(1024 * 1024)).toBe('1 MB')
  })
})
