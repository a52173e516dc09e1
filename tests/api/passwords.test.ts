/**
 * The common-password list on every route where a new password is chosen (server/utils/
 * password-rules.ts): invitation accept, password reset and password change refuse, with 422
 * and a plain message on the password field, passwords that are on the server's list (also
 * disguised: case, look-alike digits, endings), contain the application's name or the e-mail's
 * local part. A refused attempt changes nothing (the link still works, the old password still
 * signs in). The seeded demo password is set directly by the seeds and keeps working.
 */
import { describe, expect, it } from 'vitest'
import { demo, demoPassword, useServer } from '../support/server'
import { expectErrorAnswer, lastMailId, tokenFromMail } from './auth-support'

const server = useServer()

/** On the server's list (the base word "sunshine" with an ending), though not on the short list the forms check. */
const LISTED = 'Sunshine2024!'
const DISGUISED = 'Pa55word!!'
const NAMED = 'my Tributary key 7'
const GOOD = 'heron wades the shallows'

describe('choosing a new password', () => {
  it('POST /api/me/password refuses listed, disguised, named and own-address passwords; the old one stays', async () => {
    const client = await server.signIn(demo.biologist)
    const refusals: [string, RegExp][] = [
      [LISTED, /list of common or leaked passwords/],
      [DISGUISED, /list of common or leaked passwords/],
      [NAMED, /name of this application/],
      ['the biologist of the hollow', /e-mail address/],
    ]
    for (const [newPassword, words] of refusals) {
      const response = await client.post('/api/me/password', { currentPassword: demoPassword, newPassword })
      expectErrorAnswer(response, 422, words)
      expect(response.body.issues).toEqual([{ path: 'newPassword', message: expect.stringMatching(words) }])
    }
    // Nothing changed: the demo password still signs in, the session is still valid.
    expect((await client.get('/api/me')).status).toBe(200)
    expect((await server.signIn(demo.biologist, demoPassword)).hasSession).toBe(true)
    const changed = await client.post('/api/me/password', { currentPassword: demoPassword, newPassword: GOOD })
    expect(changed.status, JSON.stringify(changed.body)).toBe(200)
  })

  it('POST /api/auth/password/reset refuses a listed password and leaves the link usable', async () => {
    const before = await lastMailId(server)
    await server.anonymous().post('/api/auth/password/forgot', { email: demo.viewer })
    const { token } = await tokenFromMail(server, demo.viewer, '/reset-password', before)
    const refused = await server.anonymous().post('/api/auth/password/reset', { token, password: LISTED })
    expectErrorAnswer(refused, 422, /list of common or leaked passwords/)
    expect(refused.body.issues[0].path).toBe('password')
    expect((await server.signIn(demo.viewer, demoPassword)).hasSession).toBe(true)
    const done = await server.anonymous().post('/api/auth/password/reset', { token, password: GOOD })
    expect(done.status, JSON.stringify(done.body)).toBe(200)
    expect((await server.signIn(demo.viewer, GOOD)).hasSession).toBe(true)
  })

  it('POST /api/auth/invite/accept refuses a disguised common password and keeps the invitation open', async () => {
    const admin = await server.signIn(demo.admin)
    const email = 'marsh.keeper@demo.tributary.test'
    const before = await lastMailId(server)
    expect((await admin.post('/api/admin/users', { email, name: 'Marsh Keeper', role: 'viewer' })).status).toBe(201)
    const { token } = await tokenFromMail(server, email, '/accept-invite', before)
    const refused = await server.anonymous().post('/api/auth/invite/accept', { token, name: 'Marsh Keeper', password: DISGUISED })
    expectErrorAnswer(refused, 422, /list of common or leaked passwords/)
    const named = await server.anonymous().post('/api/auth/invite/accept', { token, name: 'Marsh Keeper', password: 'marsh.keeper in the reeds' })
    expectErrorAnswer(named, 422, /e-mail address/)
    const status = await server.db.query<{ active: boolean, password_hash: string | null }>('SELECT active, password_hash FROM users WHERE email = $1', [email])
    expect(status.rows[0]).toEqual({ active: false, password_hash: null })
    const accepted = await server.anonymous().post('/api/auth/invite/accept', { token, name: 'Marsh Keeper', password: GOOD })
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200)
  })

  it('keeps the seeded demo password working (set by the seeds, not chosen through a route)', async () => {
    expect((await server.signIn(demo.manager, demoPassword)).hasSession).toBe(true)
  })
})
