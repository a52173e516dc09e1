/**
 * Cross-site request refusal (server/middleware/csrf.ts) on every state-changing route: each
 * POST, PUT, PATCH and DELETE route file under server/api (read from disk, so a new route is
 * covered without being listed), plus nuxt-auth-utils' DELETE /api/_auth/session, sent by a
 * signed-in administrator with the headers a browser adds on another site's page:
 * - `Origin: https://elsewhere.example` → 403 with a plain message, nothing written;
 * - no Origin but `Referer` on another site → 403; `Sec-Fetch-Site: cross-site` → 403;
 * - `Origin: null` (sandboxed frames, some redirects) → 403.
 * The app's own origin, and requests with none of these headers (curl, scripts), pass; the
 * session cookie is SameSite=Lax and HttpOnly.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, demoPassword, useServer } from '../support/server'
import { expectErrorAnswer } from './auth-support'
import { databaseFingerprint, demoIds, fillPattern, idFor, scanApiRoutes, type DemoIds } from './security-support'

const server = useServer()

const ELSEWHERE = 'https://elsewhere.example'
const REFUSAL = /came from another site .*so it was refused/

/** State-changing routes: every non-GET route file, and the session route of nuxt-auth-utils. */
const changingRoutes = [
  ...scanApiRoutes().filter(route => route.method !== 'GET'),
  { method: 'DELETE' as const, pattern: '/api/_auth/session', params: [] },
]

let ids: DemoIds
let admin: ApiClient

beforeAll(async () => {
  admin = await server.signIn(demo.admin)
  ids = await demoIds(server, await server.signIn(demo.biologist))
})

/** The route's path aimed at the demo agency's records ([token] gets a made-up token). */
function pathOf(route: (typeof changingRoutes)[number]): string {
  return fillPattern(route, param => (param === 'token' ? 'A'.repeat(43) : idFor(route.pattern, param, ids)))
}

describe('state-changing routes refuse requests from another site', () => {
  it('covers every POST, PUT, PATCH and DELETE route', () => {
    expect(changingRoutes.length).toBeGreaterThanOrEqual(45)
    const methods = new Set(changingRoutes.map(route => route.method))
    expect([...methods].sort()).toEqual(['DELETE', 'PATCH', 'POST', 'PUT'])
  })

  it('answers 403 with a plain message for a foreign Origin, Referer, Sec-Fetch-Site or Origin: null, and writes nothing', async () => {
    const before = await databaseFingerprint(server)
    const foreign: Record<string, string>[] = [
      { origin: ELSEWHERE },
      { referer: `${ELSEWHERE}/innocent-page` },
      { 'sec-fetch-site': 'cross-site' },
      { origin: 'null' },
      // The same host name on another port or scheme is another origin.
      { origin: server.url.replace(/:\d+$/, ':1') },
    ]
    for (const route of changingRoutes) {
      for (const headers of foreign) {
        const body = route.method === 'DELETE' ? undefined : { email: demo.viewer, password: demoPassword }
        const response = await admin.request(route.method, pathOf(route), body, headers)
        expectErrorAnswer(response, 403, REFUSAL)
      }
    }
    expect(await databaseFingerprint(server)).toEqual(before)
    // Still signed in: even the sign-out routes were refused.
    expect((await admin.get('/api/me')).status).toBe(200)
  })

  it('names the foreign origin and the app\'s own address in the message', async () => {
    const response = await admin.request('POST', '/api/auth/logout', {}, { origin: ELSEWHERE })
    expectErrorAnswer(response, 403)
    expect(response.body.message).toContain(ELSEWHERE)
    expect(response.body.message).toContain(server.url)
  })

  it('lets the app\'s own pages through (same Origin, same-origin Referer, Sec-Fetch-Site same-origin)', async () => {
    const own: Record<string, string>[] = [
      { origin: server.url },
      { referer: `${server.url}/atlas` },
      { 'origin': server.url, 'sec-fetch-site': 'same-origin' },
    ]
    for (const headers of own) {
      const response = await admin.request('POST', '/api/calc/establishment', {}, headers)
      // Not refused as cross-site: the route itself answers (422 for the empty body).
      expect(response.status, JSON.stringify(response.body)).toBe(422)
    }
    const client = await server.signIn(demo.viewer)
    const signOut = await client.request('POST', '/api/auth/logout', {}, { 'origin': server.url, 'sec-fetch-site': 'same-origin' })
    expect(signOut.status).toBe(200)
    expect((await client.get('/api/me')).status).toBe(401)
  })

  it('lets requests without browser headers through (non-browser clients carry no victim\'s cookie)', async () => {
    const client = await server.signIn(demo.viewer)
    expect((await client.post('/api/auth/logout')).status).toBe(200)
  })

  it('leaves reading alone: GET from another site is not refused', async () => {
    const response = await admin.request('GET', '/api/me', undefined, { 'origin': ELSEWHERE, 'sec-fetch-site': 'cross-site' })
    expect(response.status).toBe(200)
  })
})

describe('the session cookie', () => {
  it('is HttpOnly and SameSite=Lax', async () => {
    const response = await server.anonymous().post('/api/auth/login', { email: demo.viewer, password: demoPassword })
    expect(response.status).toBe(200)
    const cookie = response.headers.getSetCookie().find(line => line.startsWith('nuxt-session=') && !/max-age=0/i.test(line) && !/^nuxt-session=;/.test(line))
    expect(cookie).toBeDefined()
    expect(cookie).toMatch(/;\s*HttpOnly/i)
    expect(cookie).toMatch(/;\s*SameSite=Lax/i)
  })
})
