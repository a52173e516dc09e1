/**
 * Administration routes: users (list, invite, change role/active with optimistic locking,
 * resend invitation), Outbox, agency profile — and the audit rows they write.
 */
import { describe, expect, it } from 'vitest'
import { demo, useServer } from '../support/server'
import { expectErrorAnswer, lastMailId, tokenFromMail, userId } from './auth-support'

const server = useServer()

async function auditActions(entityType: string, entityId: number): Promise<string[]> {
  const result = await server.db.query('SELECT action FROM audit_events WHERE entity_type = $1 AND entity_id = $2 ORDER BY id', [entityType, entityId])
  return result.rows.map(r => r.action as string)
}

describe('GET /api/admin/users', () => {
  it('lists the agency\'s users without secrets', async () => {
    const admin = await server.signIn(demo.admin)
    const response = await admin.get('/api/admin/users')
    expect(response.status).toBe(200)
    const emails = response.body.items.map((u: { email: string }) => u.email)
    expect(emails).toEqual(expect.arrayContaining(Object.values(demo)))
    expect(JSON.stringify(response.body)).not.toMatch(/scrypt|password/i)
    for (const user of response.body.items) {
      expect(user).toMatchObject({ id: expect.any(Number), version: expect.any(Number), status: expect.stringMatching(/^(invited|active|deactivated)$/) })
    }
  })
})

describe('POST /api/admin/users', () => {
  it('invites, normalises the address, and refuses the same address again with 409', async () => {
    const admin = await server.signIn(demo.admin)
    const created = await admin.post('/api/admin/users', { email: '  Fen.Keeper@Demo.Tributary.TEST ', name: ' Fen Keeper ', role: 'viewer' })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ email: 'fen.keeper@demo.tributary.test', name: 'Fen Keeper', status: 'invited', invitedAt: expect.any(String) })
    const again = await admin.post('/api/admin/users', { email: 'FEN.KEEPER@demo.tributary.test', name: 'Fen Again', role: 'manager' })
    expectErrorAnswer(again, 409, /already exists/)
    expectErrorAnswer(await admin.post('/api/admin/users', { email: demo.viewer, name: 'Dup', role: 'viewer' }), 409)
    expect(await auditActions('user', created.body.id)).toEqual(['user.invite'])
  })

  it('queues the invitation in the Outbox and the dispatcher sends it', async () => {
    const admin = await server.signIn(demo.admin)
    const before = await lastMailId(server)
    await admin.post('/api/admin/users', { email: 'outbox.check@demo.tributary.test', name: 'Outbox Check', role: 'viewer' })
    await tokenFromMail(server, 'outbox.check@demo.tributary.test', '/accept-invite', before)
    const outbox = await admin.get('/api/admin/outbox')
    expect(outbox.status).toBe(200)
    const entry = outbox.body.items.find((m: { to: string }) => m.to === 'outbox.check@demo.tributary.test')
    expect(entry).toMatchObject({ subject: expect.stringMatching(/invited you/), text: expect.stringMatching(/accept-invite\?token=/) })
    expect(['sending', 'sent']).toContain(entry.status)
  })
})

describe('PATCH /api/admin/users/:id', () => {
  it('changes the role with the current version, and refuses a stale version with 409', async () => {
    const admin = await server.signIn(demo.admin)
    const id = await userId(server, demo.manager)
    const list = await admin.get('/api/admin/users')
    const current = list.body.items.find((u: { id: number }) => u.id === id)
    const changed = await admin.patch(`/api/admin/users/${id}`, { role: 'biologist', version: current.version })
    expect(changed.status, JSON.stringify(changed.body)).toBe(200)
    expect(changed.body).toMatchObject({ role: 'biologist', version: current.version + 1 })
    const stale = await admin.patch(`/api/admin/users/${id}`, { role: 'viewer', version: current.version })
    expectErrorAnswer(stale, 409, /changed this user since you loaded it/)
    const back = await admin.patch(`/api/admin/users/${id}`, { role: 'manager', version: changed.body.version })
    expect(back.body.role).toBe('manager')
    expect(await auditActions('user', id)).toEqual(['user.update', 'user.update'])
  })

  it('takes effect on the next request of that user (roles come from the database)', async () => {
    const admin = await server.signIn(demo.admin)
    const manager = await server.signIn(demo.manager)
    const id = await userId(server, demo.manager)
    const version = (await admin.get('/api/admin/users')).body.items.find((u: { id: number }) => u.id === id).version
    const promoted = await admin.patch(`/api/admin/users/${id}`, { role: 'administrator', version })
    expect((await manager.get('/api/admin/users')).status).toBe(200)
    await admin.patch(`/api/admin/users/${id}`, { role: 'manager', version: promoted.body.version })
    expectErrorAnswer(await manager.get('/api/admin/users'), 403, /needs administrator/)
  })

  it('deactivating ends the user\'s sessions and blocks sign-in; reactivating lets them back', async () => {
    const admin = await server.signIn(demo.admin)
    const viewer = await server.signIn(demo.viewer)
    const id = await userId(server, demo.viewer)
    const version = (await admin.get('/api/admin/users')).body.items.find((u: { id: number }) => u.id === id).version
    const off = await admin.patch(`/api/admin/users/${id}`, { active: false, version })
    expect(off.body).toMatchObject({ active: false, status: 'deactivated' })
    expectErrorAnswer(await viewer.get('/api/me'), 401)
    expectErrorAnswer(await server.anonymous().post('/api/auth/login', { email: demo.viewer, password: 'tributary-demo' }), 403, /deactivated/)
    const on = await admin.patch(`/api/admin/users/${id}`, { active: true, version: off.body.version })
    expect(on.body.status).toBe('active')
    expect((await server.signIn(demo.viewer)).hasSession).toBe(true)
  })

  it('refuses administrators demoting or deactivating themselves (422)', async () => {
    const admin = await server.signIn(demo.admin)
    const id = await userId(server, demo.admin)
    const version = (await admin.get('/api/admin/users')).body.items.find((u: { id: number }) => u.id === id).version
    expectErrorAnswer(await admin.patch(`/api/admin/users/${id}`, { role: 'manager', version }), 422, /your own administrator role/)
    expectErrorAnswer(await admin.patch(`/api/admin/users/${id}`, { active: false, version }), 422)
    expect((await admin.patch(`/api/admin/users/${id}`, { role: 'administrator', version })).status).toBe(200)
  })

  it('answers 404 for an id that does not exist', async () => {
    const admin = await server.signIn(demo.admin)
    expectErrorAnswer(await admin.patch('/api/admin/users/999999', { role: 'viewer', version: 0 }), 404, /User not found/)
  })
})

describe('POST /api/admin/users/:id/invite', () => {
  it('sends a new link that replaces the old one', async () => {
    const admin = await server.signIn(demo.admin)
    const email = 'resend.me@demo.tributary.test'
    let before = await lastMailId(server)
    const created = await admin.post('/api/admin/users', { email, name: 'Resend Me', role: 'viewer' })
    const first = await tokenFromMail(server, email, '/accept-invite', before)
    before = await lastMailId(server)
    const resent = await admin.post(`/api/admin/users/${created.body.id}/invite`)
    expect(resent.status, JSON.stringify(resent.body)).toBe(200)
    const second = await tokenFromMail(server, email, '/accept-invite', before)
    expect(second.token).not.toBe(first.token)
    expectErrorAnswer(await server.anonymous().get(`/api/auth/tokens/${first.token}`), 410, /newer one replaced it/)
    const accepted = await server.anonymous().post('/api/auth/invite/accept', { token: second.token, name: 'Resend Me', password: 'willow roots hold banks' })
    expect(accepted.status).toBe(200)
    expectErrorAnswer(await admin.post(`/api/admin/users/${created.body.id}/invite`), 409, /already accepted/)
    expect(await auditActions('user', created.body.id)).toEqual(['user.invite', 'user.invite_resend', 'user.invite_accept'])
  })
})

describe('GET /api/admin/outbox', () => {
  it('filters by status and pages 25 at a time', async () => {
    const admin = await server.signIn(demo.admin)
    const agency = await server.db.query('SELECT agency_id FROM users WHERE email = $1', [demo.admin])
    const agencyId = agency.rows[0].agency_id
    await server.db.query(
      `INSERT INTO outbox_messages (agency_id, to_address, subject, text_body, status, attempts, last_error, next_attempt_at)
       SELECT $1, 'failed' || g || '@example.org', 'Failed ' || g, 'body', 'failed', 8, 'refused', now() FROM generate_series(1, 27) g`,
      [agencyId],
    )
    const first = await admin.get('/api/admin/outbox?status=failed')
    expect(first.status).toBe(200)
    expect(first.body).toMatchObject({ page: 1, pageSize: 25, total: 27 })
    expect(first.body.items).toHaveLength(25)
    expect(first.body.items[0]).toMatchObject({ status: 'failed', attempts: 8, lastError: 'refused', text: 'body' })
    const second = await admin.get('/api/admin/outbox?status=failed&page=2')
    expect(second.body.items).toHaveLength(2)
    const all = await admin.get('/api/admin/outbox?status=')
    expect(all.body.total).toBeGreaterThanOrEqual(27)
  })
})

describe('agency profile', () => {
  it('reads and updates with optimistic locking, and writes an audit event', async () => {
    const admin = await server.signIn(demo.admin)
    const current = await admin.get('/api/admin/agency')
    expect(current.status).toBe(200)
    expect(current.body).toMatchObject({ name: expect.stringMatching(/Eastern Uplands/), shortName: expect.any(String), version: expect.any(Number) })
    const updated = await admin.patch('/api/admin/agency', {
      name: current.body.name, shortName: 'EUWS-2', address: 'Headwaters Building\nRidgeford (invented)', contactEmail: 'Office@Demo.Tributary.test', version: current.body.version,
    })
    expect(updated.status, JSON.stringify(updated.body)).toBe(200)
    expect(updated.body).toMatchObject({ shortName: 'EUWS-2', contactEmail: 'office@demo.tributary.test', version: current.body.version + 1, phone: current.body.phone })
    const cleared = await admin.patch('/api/admin/agency', { name: current.body.name, shortName: 'EUWS', contactEmail: '', version: updated.body.version })
    expect(cleared.body.contactEmail).toBeNull()
    expectErrorAnswer(await admin.patch('/api/admin/agency', { name: 'Other', shortName: 'O', version: current.body.version }), 409, /since you loaded it/)
    expect(await auditActions('agency', current.body.id)).toEqual(expect.arrayContaining(['agency.update']))
    const me = await admin.get('/api/me')
    expect(me.body.agency.shortName).toBe('EUWS')
  })
})
