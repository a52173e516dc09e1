/**
 * Session lifetime and fixation (server/utils/auth.ts `startSession`, `requireUser`):
 * - signing in starts a new session: the id and cookie issued before sign-in are not the ones
 *   after, and the cookie from before does not carry the sign-in;
 * - a session lasts runtimeConfig.session.maxAge from sign-in (12 hours; the cookie says so)
 *   and is refused after it with 401 "Your session has expired …";
 * Signing out everywhere on a password change is tested in auth.test.ts (POST /api/me/password).
 */
import { describe, expect, it } from 'vitest'
import { demo, demoPassword, eventually, useServer } from '../support/server'
import { expectErrorAnswer } from './auth-support'

const server = useServer()

describe('session fixation', () => {
  it('issues a new session id and cookie on sign-in; the cookie from before stays signed out', async () => {
    const browser = server.anonymous()
    const before = await browser.get('/api/_auth/session')
    expect(before.status).toBe(200)
    expect(before.body.user).toBeUndefined()
    const anonymousId = before.body.id as string
    const anonymousCookie = browser.cookieHeader
    expect(anonymousId).toMatch(/\S{8,}/)
    expect(anonymousCookie).toMatch(/^nuxt-session=/)

    expect((await browser.post('/api/auth/login', { email: demo.biologist, password: demoPassword })).status).toBe(200)
    const after = await browser.get('/api/_auth/session')
    expect(after.body.user.email).toBe(demo.biologist)
    expect(after.body.id).not.toBe(anonymousId)
    expect(browser.cookieHeader).not.toBe(anonymousCookie)

    // Someone holding the cookie from before the sign-in (planted or copied) is not signed in.
    const planted = server.anonymous({ cookie: anonymousCookie })
    expectErrorAnswer(await planted.get('/api/me'), 401)
    expect((await planted.get('/api/_auth/session')).body.user).toBeUndefined()
    expect((await browser.get('/api/me')).status).toBe(200)
  })

  it('also starts a new session when someone signs in over an existing one', async () => {
    const browser = await server.signIn(demo.viewer)
    const first = (await browser.get('/api/_auth/session')).body.id as string
    expect((await browser.post('/api/auth/login', { email: demo.manager, password: demoPassword })).status).toBe(200)
    const second = await browser.get('/api/_auth/session')
    expect(second.body.user.email).toBe(demo.manager)
    expect(second.body.id).not.toBe(first)
  })
})

describe('session expiry', () => {
  it('sets the cookie to expire 12 hours after sign-in', async () => {
    const response = await server.anonymous().post('/api/auth/login', { email: demo.viewer, password: demoPassword })
    const line = response.headers.getSetCookie().find(l => /^nuxt-session=[^;]+/.test(l) && !/^nuxt-session=;/.test(l))
    const expires = Date.parse(/expires=([^;]+)/i.exec(line ?? '')?.[1] ?? '')
    const twelveHours = 12 * 60 * 60 * 1000
    expect(Math.abs(expires - (Date.now() + twelveHours))).toBeLessThan(60_000)
  })

  it('refuses a session older than maxAge with 401 "expired" (server restarted with a 2-second maxAge)', async () => {
    await server.restart({ NUXT_SESSION_MAX_AGE: '2' })
    const client = await server.signIn(demo.biologist)
    expect((await client.get('/api/me')).status).toBe(200)
    const refused = await eventually(async () => {
      const response = await client.get('/api/me')
      return response.status === 401 ? response : undefined
    }, 10_000)
    expectErrorAnswer(refused, 401, /session has expired/)
    // The page's view of the session is signed out too.
    expect((await client.get('/api/_auth/session')).body.user).toBeUndefined()
    // Signing in again works.
    expect((await (await server.signIn(demo.biologist)).get('/api/me')).status).toBe(200)
  })
})
