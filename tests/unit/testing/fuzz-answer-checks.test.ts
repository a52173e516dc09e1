/**
 * The checks the API fuzz tests apply to every answer (tests/api/fuzz-http.ts) must catch what
 * they are there for: a 5xx, internals in an error, an error that is not JSON or has no sentence.
 * Expected values: common practice, no source.
 */
import { describe, expect, it } from 'vitest'
import { answerProblems, INTERNAL_DETAIL } from '../../api/fuzz-http'

const json = { 'content-type': 'application/json; charset=utf-8' }
const answer = (status: number, body: unknown, headers: Record<string, string> = json) =>
  ({ status, headers, text: typeof body === 'string' ? body : JSON.stringify(body) })

describe('answerProblems', () => {
  it('passes a readable 4xx and any 2xx', () => {
    expect(answerProblems(answer(404, { message: 'Proposal not found.' }))).toEqual([])
    expect(answerProblems(answer(422, { message: 'name: Enter a name.', issues: [{ path: 'name', message: 'Enter a name.' }] }))).toEqual([])
    expect(answerProblems(answer(200, '<html>at /x.ts:1</html>', { 'content-type': 'text/html' }))).toEqual([])
  })

  it.each([
    ['a 500 with a plain message', answer(500, { message: 'Something went wrong on our side. Please try again.' })],
    ['a 503', answer(503, { message: 'The database cannot be reached right now.' })],
    ['a stack frame', answer(400, { message: 'Bad thing happened', stack: 'Error\n    at /srv/app/index.mjs:10:5' })],
    ['a source path', answer(422, { message: 'Failed in server/api/x.ts:12', issues: [] })],
    ['SQL text', answer(409, { message: 'duplicate key value violates unique constraint "users_email_key"' })],
    ['a query', answer(400, { message: 'Query failed: SELECT "id" FROM "users" WHERE x' })],
    ['a runtime error name', answer(400, { message: 'TypeError: Cannot read properties of undefined' })],
    ['an HTML error page', answer(404, '<!DOCTYPE html><p>Page not found</p>', { 'content-type': 'text/html' })],
    ['no message', answer(400, { error: true })],
    ['a one-word message', answer(400, { message: 'Error' })],
    ['zod wording', answer(422, { message: 'Invalid input: expected string, received number', issues: [] })],
    ['a 422 without issues', answer(422, { message: 'The request is not valid.' })],
  ])('flags %s', (_label, bad) => {
    expect(answerProblems(bad).length).toBeGreaterThan(0)
  })

  it('does not flag ordinary sentences as internals', () => {
    for (const text of ['Use at least 8 characters.', 'Choose one of: "draft", "submitted".', 'Select a species first.', 'The update was saved.']) {
      expect(INTERNAL_DETAIL.test(text), text).toBe(false)
    }
  })
})
