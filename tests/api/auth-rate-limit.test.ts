/**
 * Sign-in rate limits (server/utils/rate-limit.ts): 5 failures per account in 15 minutes,
 * 20 per network address. Own file, because the address limit blocks this client's address for
 * the rest of the file.
 */
import { describe, expect, it } from 'vitest'
import { demo, demoPassword, useServer } from '../support/server'
import { expectErrorAnswer } from './auth-support'

const server = useServer()

describe('sign-in rate limits', () => {
  it('blocks an account after 5 failures, even with the right password, and says when to retry', async () => {
    for (let i = 0; i < 5; i += 1) {
      expectErrorAnswer(await server.anonymous().post('/api/auth/login', { email: demo.manager, password: `wrong guess ${i}` }), 401)
    }
    const blocked = await server.anonymous().post('/api/auth/login', { email: demo.manager, password: demoPassword })
    expectErrorAnswer(blocked, 429, /Too many failed sign-in attempts for this account\. Try again in 15 minutes\./)
    const retryAfter = Number(blocked.headers.get('retry-after'))
    expect(retryAfter).toBeGreaterThan(14 * 60)
    expect(retryAfter).toBeLessThanOrEqual(15 * 60)
    // Other accounts are not affected.
    expect((await server.anonymous().post('/api/auth/login', { email: demo.viewer, password: demoPassword })).status).toBe(200)
  })

  it('opens again once the failures leave the 15-minute window', async () => {
    await server.db.query(`UPDATE sign_in_attempts SET attempted_at = attempted_at - interval '16 minutes' WHERE key = $1`, [`account:${demo.manager}`])
    expect((await server.anonymous().post('/api/auth/login', { email: demo.manager, password: demoPassword })).status).toBe(200)
  })

  it('forgives earlier failures after a successful sign-in', async () => {
    for (let i = 0; i < 4; i += 1) await server.anonymous().post('/api/auth/login', { email: demo.biologist, password: `wrong ${i}` })
    expect((await server.anonymous().post('/api/auth/login', { email: demo.biologist, password: demoPassword })).status).toBe(200)
    for (let i = 0; i < 4; i += 1) {
      expectErrorAnswer(await server.anonymous().post('/api/auth/login', { email: demo.biologist, password: `wrong again ${i}` }), 401)
    }
  })

  it('counts parallel guesses one by one (no burst past the limit)', async () => {
    const results = await Promise.all(Array.from({ length: 8 }, (_, i) =>
      server.anonymous().post('/api/auth/login', { email: demo.admin, password: `parallel guess ${i}` })))
    const statuses = results.map(r => r.status).sort()
    expect(statuses.filter(s => s === 401)).toHaveLength(5)
    expect(statuses.filter(s => s === 429)).toHaveLength(3)
  })

  it('blocks a network address after 20 failures across any accounts', async () => {
    await server.db.query('DELETE FROM sign_in_attempts')
    for (let i = 0; i < 20; i += 1) {
      expectErrorAnswer(await server.anonymous().post('/api/auth/login', { email: `guess${i}@nowhere.example`, password: 'wrong guess' }), 401)
    }
    const blocked = await server.anonymous().post('/api/auth/login', { email: demo.viewer, password: demoPassword })
    expectErrorAnswer(blocked, 429, /for this network address/)
    expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0)
  })
})
