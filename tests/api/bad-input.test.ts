/**
 * Bad input on every sign-in, account and administration route: malformed JSON, a body that is
 * not an object, missing fields, wrong types, overlong strings, oversized bodies, bad ids and
 * query values. Each must answer 4xx with a readable `message` (and `issues` for 422), never 500.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { expectErrorAnswer } from './auth-support'

const server = useServer()
let admin: ApiClient

beforeAll(async () => {
  admin = await server.signIn(demo.admin)
})

interface BodyRoute {
  method: 'POST' | 'PATCH'
  path: string
  /** Signed in as the administrator (else anonymous). */
  auth: boolean
  /** A body with every field of the wrong type. */
  wrongTypes: Record<string, unknown>
  /** A body with a string field far too long (other fields valid). */
  overlong: Record<string, unknown>
  /** Fields that must be reported when the body is `{}`. */
  required: string[]
}

const long = (n: number) => 'x'.repeat(n)
const token = 'A'.repeat(43)

const bodyRoutes: BodyRoute[] = [
  { method: 'POST', path: '/api/auth/login', auth: false, wrongTypes: { email: 42, password: ['x'] }, overlong: { email: `${long(300)}@example.org`, password: 'x' }, required: ['email', 'password'] },
  { method: 'POST', path: '/api/auth/password/forgot', auth: false, wrongTypes: { email: { a: 1 } }, overlong: { email: `${long(300)}@example.org` }, required: ['email'] },
  { method: 'POST', path: '/api/auth/password/reset', auth: false, wrongTypes: { token: 1, password: true }, overlong: { token, password: long(201) }, required: ['token', 'password'] },
  { method: 'POST', path: '/api/auth/invite/accept', auth: false, wrongTypes: { token: null, name: 5, password: 5 }, overlong: { token, name: long(500), password: 'long enough phrase' }, required: ['token', 'name', 'password'] },
  { method: 'POST', path: '/api/me/password', auth: true, wrongTypes: { currentPassword: 1, newPassword: 2 }, overlong: { currentPassword: 'tributary-demo', newPassword: long(5000) }, required: ['currentPassword', 'newPassword'] },
  { method: 'POST', path: '/api/admin/users', auth: true, wrongTypes: { email: [], name: {}, role: 3 }, overlong: { email: 'a@example.org', name: long(1000), role: 'viewer' }, required: ['email', 'name', 'role'] },
  { method: 'PATCH', path: '/api/admin/users/2', auth: true, wrongTypes: { role: 'emperor', active: 'yes', version: '0' }, overlong: { role: long(300), version: 0 }, required: ['version'] },
  { method: 'PATCH', path: '/api/admin/agency', auth: true, wrongTypes: { name: 1, shortName: 2, address: 3, contactEmail: 4, version: 'v' }, overlong: { name: 'Agency', shortName: long(100), version: 0 }, required: ['name', 'shortName', 'version'] },
]

function clientFor(route: BodyRoute): ApiClient {
  return route.auth ? admin : server.anonymous()
}

describe.each(bodyRoutes)('$method $path', (route) => {
  const send = (body: unknown, headers: Record<string, string> = {}) =>
    clientFor(route).request(route.method, route.path, body, headers)

  it('answers 400 for malformed JSON', async () => {
    expectErrorAnswer(await send('{"email": "a@b.c", ', { 'content-type': 'application/json' }), 400, /not valid JSON/)
    expectErrorAnswer(await send('not json at all'), 400, /not valid JSON/)
  })

  it('answers 422 naming each missing field for an empty body and for {}', async () => {
    for (const body of [{}, '']) {
      const response = await send(body, { 'content-type': 'application/json' })
      expectErrorAnswer(response, 422)
      const paths = response.body.issues.map((i: { path: string }) => i.path)
      expect(paths).toEqual(expect.arrayContaining(route.required))
      for (const issue of response.body.issues) expect(issue.message).toMatch(/^[A-Z].*\.$/)
    }
  })

  it('answers 422 for a JSON value that is not an object', async () => {
    for (const body of ['[]', '"text"', '42', 'null']) {
      expectErrorAnswer(await send(body, { 'content-type': 'application/json' }), 422)
    }
  })

  it('answers 422 for wrong types, with readable messages', async () => {
    const response = await send(route.wrongTypes)
    expectErrorAnswer(response, 422)
    for (const issue of response.body.issues) {
      expect(issue.message).not.toMatch(/Invalid input|expected .* received/)
    }
  })

  it('answers 422 for overlong strings', async () => {
    const response = await send(route.overlong)
    expectErrorAnswer(response, 422)
    expect(response.body.message).toMatch(/at most|valid|Choose/)
  })

  it('answers 413 for a body over 16 KB', async () => {
    expectErrorAnswer(await send({ ...route.overlong, padding: long(20_000) }), 413, /too large/)
  })

  it('answers 415 for a form post', async () => {
    expectErrorAnswer(await send('email=a%40b.c', { 'content-type': 'application/x-www-form-urlencoded' }), 415, /JSON/)
  })
})

describe('route parameters and query strings', () => {
  it('refuses ids that are not record numbers with 422', async () => {
    for (const id of ['abc', '0', '-3', '1.5', '99999999999', '1e3']) {
      expectErrorAnswer(await admin.patch(`/api/admin/users/${id}`, { role: 'viewer', version: 0 }), 422, /record number/)
      expectErrorAnswer(await admin.post(`/api/admin/users/${id}/invite`), 422, /record number/)
    }
  })

  it('refuses an overlong token in the address with 422 and answers 404 for an unknown one', async () => {
    expectErrorAnswer(await server.anonymous().get(`/api/auth/tokens/${long(300)}`), 422)
    expectErrorAnswer(await server.anonymous().get('/api/auth/tokens/%20'), 422)
    expectErrorAnswer(await server.anonymous().get(`/api/auth/tokens/${token}`), 404)
  })

  it('refuses bad Outbox filters with 422', async () => {
    for (const query of ['status=lost', 'page=0', 'page=-1', 'page=abc', 'page=1.5', 'page=1000000']) {
      expectErrorAnswer(await admin.get(`/api/admin/outbox?${query}`), 422)
    }
    expect((await admin.get('/api/admin/outbox?status=queued&page=3')).status).toBe(200)
  })

  it('answers JSON 404 for an API route that does not exist', async () => {
    expectErrorAnswer(await admin.get('/api/admin/nothing-here'), 404)
  })
})
