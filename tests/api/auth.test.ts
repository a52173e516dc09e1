/**
 * Sign-in, sign-out, /api/me, password change, forgotten password and invitation, end to end
 * against the built server (e-mail read back from the capturing SMTP server).
 */
import { describe, expect, it } from 'vitest'
import { demo, demoPassword, useServer } from '../support/server'
import { expectErrorAnswer, lastMailId, tokenFromMail, userId } from './auth-support'

const server = useServer()
const WRONG = /e-mail address or password is not correct/

describe('POST /api/auth/login', () => {
  it('signs in with the right password and sets a session cookie', async () => {
    const client = server.anonymous()
    const response = await client.post('/api/auth/login', { email: demo.manager, password: demoPassword })
    expect(response.status).toBe(200)
    expect(response.body.user).toMatchObject({ email: demo.manager, role: 'manager' })
    expect(response.body.user.passwordHash).toBeUndefined()
    expect(client.hasSession).toBe(true)
    const me = await client.get('/api/me')
    expect(me.status).toBe(200)
    expect(me.body.user.email).toBe(demo.manager)
  })

  it('accepts the address in any letter case and with spaces around it', async () => {
    const response = await server.anonymous().post('/api/auth/login', { email: `  ${demo.biologist.toUpperCase()} `, password: demoPassword })
    expect(response.status).toBe(200)
  })

  it('answers the same 401 for a wrong password and an unknown address', async () => {
    const wrong = await server.anonymous().post('/api/auth/login', { email: demo.viewer, password: 'not the password' })
    const unknown = await server.anonymous().post('/api/auth/login', { email: 'nobody@demo.tributary.test', password: 'not the password' })
    expectErrorAnswer(wrong, 401, WRONG)
    expectErrorAnswer(unknown, 401, WRONG)
    expect(unknown.body).toEqual(wrong.body)
  })

  it('records the last sign-in time', async () => {
    await server.signIn(demo.viewer)
    const result = await server.db.query('SELECT last_sign_in_at FROM users WHERE email = $1', [demo.viewer])
    expect(Date.now() - new Date(result.rows[0].last_sign_in_at).getTime()).toBeLessThan(60_000)
  })
})

describe('POST /api/auth/logout and GET /api/me', () => {
  it('returns the user and the agency name while signed in', async () => {
    const client = await server.signIn(demo.admin)
    const me = await client.get('/api/me')
    expect(me.status).toBe(200)
    expect(me.body.user).toMatchObject({ email: demo.admin, role: 'administrator' })
    expect(me.body.agency.name).toMatch(/Eastern Uplands/)
  })

  it('ends the session: /api/me answers 401 afterwards', async () => {
    const client = await server.signIn(demo.manager)
    const out = await client.post('/api/auth/logout')
    expect(out.status).toBe(200)
    expectErrorAnswer(await client.get('/api/me'), 401, /sign in/i)
  })

  it('answers 401 "Please sign in." without a session', async () => {
    const response = await server.anonymous().get('/api/me')
    expectErrorAnswer(response, 401)
    expect(response.body.message).toBe('Please sign in.')
  })

  it('refuses a forged cookie', async () => {
    const response = await server.anonymous({ cookie: 'nuxt-session=Fe26.2**forged**value' }).get('/api/me')
    expectErrorAnswer(response, 401)
  })
})

describe('POST /api/me/password', () => {
  it('changes the password, keeps this session and ends every other one', async () => {
    const email = demo.biologist
    const mine = await server.signIn(email)
    const other = await server.signIn(email)
    const changed = await mine.post('/api/me/password', { currentPassword: demoPassword, newPassword: 'heron over the marsh' })
    expect(changed.status, JSON.stringify(changed.body)).toBe(200)
    expect((await mine.get('/api/me')).status).toBe(200)
    expectErrorAnswer(await other.get('/api/me'), 401, /session has ended/)
    expectErrorAnswer(await server.anonymous().post('/api/auth/login', { email, password: demoPassword }), 401, WRONG)
    const again = await server.signIn(email, 'heron over the marsh')
    // Put the demo password back for the other tests: it is on the blocklist, so through SQL.
    const seeded = await server.db.query('SELECT password_hash FROM users WHERE email = $1', [demo.manager])
    await server.db.query('UPDATE users SET password_hash = $1 WHERE email = $2', [seeded.rows[0].password_hash, email])
    expect((await again.get('/api/me')).status).toBe(200)
  })

  it('refuses a wrong current password with an issue on currentPassword', async () => {
    const client = await server.signIn(demo.viewer)
    const response = await client.post('/api/me/password', { currentPassword: 'not my password', newPassword: 'heron over the marsh' })
    expectErrorAnswer(response, 422, /current password is not correct/)
    expect(response.body.issues).toEqual([{ path: 'currentPassword', message: 'The current password is not correct.' }])
  })

  it('refuses short, common and own-address passwords', async () => {
    const client = await server.signIn(demo.viewer)
    for (const [newPassword, words] of [['short1', /at least 10/], ['password123', /too common/], ['viewer2024!', /e-mail address/]] as const) {
      const response = await client.post('/api/me/password', { currentPassword: demoPassword, newPassword })
      expectErrorAnswer(response, 422, words)
      expect(response.body.issues[0].path).toBe('newPassword')
    }
  })

  it('needs a session', async () => {
    expectErrorAnswer(await server.anonymous().post('/api/me/password', { currentPassword: 'x', newPassword: 'heron over the marsh' }), 401)
  })
})

describe('forgotten password', () => {
  const ANSWER = /If an account uses that address/

  it('answers 202 with the same message for unknown and known addresses, and mails only the known one', async () => {
    const before = await lastMailId(server)
    const unknown = await server.anonymous().post('/api/auth/password/forgot', { email: 'nobody-here@demo.tributary.test' })
    const known = await server.anonymous().post('/api/auth/password/forgot', { email: demo.viewer })
    expect(unknown.status).toBe(202)
    expect(known.status).toBe(202)
    expect(unknown.body).toEqual(known.body)
    expect(known.body.message).toMatch(ANSWER)
    const { mail } = await tokenFromMail(server, demo.viewer, '/reset-password', before)
    expect(mail.subject).toMatch(/Reset your Tributary password/)
    expect(mail.text).toMatch(/Eastern Uplands Wildlife Service/)
    expect(mail.text).toContain(`${server.url}/reset-password?token=`)
    const all = await server.mail.messages()
    expect(all.some(m => JSON.stringify(m.to).includes('nobody-here'))).toBe(false)
  })

  it('resets once with a good password, ends old sessions, and refuses the link a second time', async () => {
    const email = demo.manager
    const oldSession = await server.signIn(email)
    const before = await lastMailId(server)
    await server.anonymous().post('/api/auth/password/forgot', { email })
    const { token } = await tokenFromMail(server, email, '/reset-password', before)

    const info = await server.anonymous().get(`/api/auth/tokens/${token}`)
    expect(info.status).toBe(200)
    expect(info.body).toMatchObject({ purpose: 'reset', email, agencyName: expect.stringMatching(/Eastern Uplands/) })

    const weak = await server.anonymous().post('/api/auth/password/reset', { token, password: 'qwertyuiop' })
    expectErrorAnswer(weak, 422, /too common/)
    const done = await server.anonymous().post('/api/auth/password/reset', { token, password: 'alder catkins in march' })
    expect(done.status, JSON.stringify(done.body)).toBe(200)

    expectErrorAnswer(await oldSession.get('/api/me'), 401)
    expect((await server.signIn(email, 'alder catkins in march')).hasSession).toBe(true)
    expectErrorAnswer(await server.anonymous().post('/api/auth/password/reset', { token, password: 'another long phrase' }), 410, /already been used/)
    expectErrorAnswer(await server.anonymous().get(`/api/auth/tokens/${token}`), 410)

    const seeded = await server.db.query('SELECT password_hash FROM users WHERE email = $1', [demo.viewer])
    await server.db.query('UPDATE users SET password_hash = $1 WHERE email = $2', [seeded.rows[0].password_hash, email])
  })

  it('refuses an expired link with 410 and an unknown one with 404', async () => {
    const before = await lastMailId(server)
    await server.anonymous().post('/api/auth/password/forgot', { email: demo.admin })
    const { token } = await tokenFromMail(server, demo.admin, '/reset-password', before)
    await server.db.query(`UPDATE user_tokens SET expires_at = now() - interval '1 minute' WHERE purpose = 'reset' AND used_at IS NULL AND user_id = $1`, [await userId(server, demo.admin)])
    expectErrorAnswer(await server.anonymous().get(`/api/auth/tokens/${token}`), 410, /expired/)
    expectErrorAnswer(await server.anonymous().post('/api/auth/password/reset', { token, password: 'alder catkins in march' }), 410, /expired/)
    expectErrorAnswer(await server.anonymous().get('/api/auth/tokens/NotARealTokenAtAll'), 404, /not valid/)
    expectErrorAnswer(await server.anonymous().post('/api/auth/password/reset', { token: 'NotARealTokenAtAll', password: 'alder catkins in march' }), 404)
  })

  it('stores only the SHA-256 digest of the token', async () => {
    const before = await lastMailId(server)
    await server.anonymous().post('/api/auth/password/forgot', { email: demo.biologist })
    const { token } = await tokenFromMail(server, demo.biologist, '/reset-password', before)
    const rows = await server.db.query('SELECT token_hash FROM user_tokens')
    expect(rows.rows.some(r => r.token_hash === token)).toBe(false)
    const { createHash } = await import('node:crypto')
    expect(rows.rows.some(r => r.token_hash === createHash('sha256').update(token).digest('hex'))).toBe(true)
  })
})

describe('invitation', () => {
  it('invites, mails a link, accepts once and signs the person in', async () => {
    const admin = await server.signIn(demo.admin)
    const email = 'river.warden@demo.tributary.test'
    const before = await lastMailId(server)
    const created = await admin.post('/api/admin/users', { email, name: 'River Warden', role: 'biologist' })
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    expect(created.body).toMatchObject({ email, status: 'invited', active: false, role: 'biologist' })

    // Not able to sign in before accepting.
    expectErrorAnswer(await server.anonymous().post('/api/auth/login', { email, password: 'anything at all' }), 401, WRONG)

    const { token, mail } = await tokenFromMail(server, email, '/accept-invite', before)
    expect(mail.subject).toMatch(/invited you to Tributary \(Eastern Uplands Wildlife Service\)/)
    expect(mail.text).toMatch(/biologist/)

    const info = await server.anonymous().get(`/api/auth/tokens/${token}`)
    expect(info.body).toMatchObject({ purpose: 'invite', email, name: 'River Warden' })

    const ownAddress = await server.anonymous().post('/api/auth/invite/accept', { token, name: 'River Warden', password: 'river.warden1' })
    expectErrorAnswer(ownAddress, 422, /e-mail address/)

    const invitee = server.anonymous()
    const accepted = await invitee.post('/api/auth/invite/accept', { token, name: 'River M. Warden', password: 'sedge meadow at dawn' })
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200)
    expect(accepted.body.user).toMatchObject({ email, name: 'River M. Warden', role: 'biologist' })
    const me = await invitee.get('/api/me')
    expect(me.status).toBe(200)
    expect(me.body.user.name).toBe('River M. Warden')

    expectErrorAnswer(await server.anonymous().post('/api/auth/invite/accept', { token, name: 'X', password: 'sedge meadow at dusk' }), 410)
    expect((await server.signIn(email, 'sedge meadow at dawn')).hasSession).toBe(true)

    const audit = await server.db.query(`SELECT action FROM audit_events WHERE entity_type = 'user' AND entity_id = $1 ORDER BY id`, [created.body.id])
    expect(audit.rows.map(r => r.action)).toEqual(['user.invite', 'user.invite_accept'])
  })

  it('refuses a reset link on the invitation route and the other way round', async () => {
    const admin = await server.signIn(demo.admin)
    const email = 'crossed.links@demo.tributary.test'
    const before = await lastMailId(server)
    await admin.post('/api/admin/users', { email, name: 'Crossed Links', role: 'viewer' })
    const { token } = await tokenFromMail(server, email, '/accept-invite', before)
    expectErrorAnswer(await server.anonymous().post('/api/auth/password/reset', { token, password: 'sedge meadow at dawn' }), 404)
  })
})

describe('GET /api/_auth/session (what the app reads)', () => {
  it('drops the user once their sessions were ended, and carries role changes', async () => {
    const admin = await server.signIn(demo.admin)
    const viewer = await server.signIn(demo.viewer)
    expect((await viewer.get('/api/_auth/session')).body.user).toMatchObject({ email: demo.viewer, role: 'viewer' })

    const id = await userId(server, demo.viewer)
    const version = (await admin.get('/api/admin/users')).body.items.find((u: { id: number }) => u.id === id).version
    const promoted = await admin.patch(`/api/admin/users/${id}`, { role: 'biologist', version })
    expect((await viewer.get('/api/_auth/session')).body.user.role).toBe('biologist')

    await admin.patch(`/api/admin/users/${id}`, { active: false, version: promoted.body.version })
    const after = await viewer.get('/api/_auth/session')
    expect(after.status).toBe(200)
    expect(after.body.user).toBeUndefined()
    expect(viewer.hasSession).toBe(false)

    const current = (await admin.get('/api/admin/users')).body.items.find((u: { id: number }) => u.id === id)
    await admin.patch(`/api/admin/users/${id}`, { role: 'viewer', active: true, version: current.version })
  })
})
