/**
 * Who may call each sign-in, account and administration route: anonymous, each role of the
 * demo agency, and the administrator of another agency (whose view of the demo agency's
 * records must be 404, never 403, and whose lists must not show them).
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient, ApiResponse } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword, userId } from './auth-support'

const server = useServer()

type Caller = 'anonymous' | 'viewer' | 'biologist' | 'manager' | 'administrator' | 'otherAdmin'
const CALLERS: Caller[] = ['anonymous', 'viewer', 'biologist', 'manager', 'administrator', 'otherAdmin']

let clients: Record<Caller, ApiClient>
let other: Awaited<ReturnType<typeof createOtherAgency>>
let targetId: number

beforeAll(async () => {
  other = await createOtherAgency(server)
  targetId = await userId(server, demo.biologist)
  clients = {
    anonymous: server.anonymous(),
    viewer: await server.signIn(demo.viewer),
    biologist: await server.signIn(demo.biologist),
    manager: await server.signIn(demo.manager),
    administrator: await server.signIn(demo.admin),
    otherAdmin: await server.signIn(other.adminEmail, otherAgencyPassword),
  }
})

/** Routes only administrators may call, with a request that would succeed for one. */
const adminOnly: { name: string, call: (c: ApiClient) => Promise<ApiResponse> }[] = [
  { name: 'GET /api/admin/users', call: c => c.get('/api/admin/users') },
  { name: 'POST /api/admin/users', call: c => c.post('/api/admin/users', { email: `perm.${Math.random().toString(36).slice(2)}@perm.tributary.test`, name: 'Perm Check', role: 'viewer' }) },
  { name: 'GET /api/admin/outbox', call: c => c.get('/api/admin/outbox') },
  { name: 'GET /api/admin/agency', call: c => c.get('/api/admin/agency') },
]

describe('administration routes', () => {
  for (const route of adminOnly) {
    it(`${route.name}: 401 anonymous, 403 for viewer/biologist/manager, 2xx for administrators`, async () => {
      expectErrorAnswer(await route.call(clients.anonymous), 401, /sign in/i)
      for (const role of ['viewer', 'biologist', 'manager'] as const) {
        const response = await route.call(clients[role])
        expectErrorAnswer(response, 403)
        expect(response.body.message).toBe(`Your role (${role}) cannot do this: it needs administrator.`)
      }
      expect([200, 201]).toContain((await route.call(clients.administrator)).status)
      expect([200, 201]).toContain((await route.call(clients.otherAdmin)).status)
    })
  }

  it('PATCH /api/admin/users/:id and POST …/invite: 401 / 403 by role, 404 for another agency\'s administrator', async () => {
    const calls = [
      (c: ApiClient) => c.patch(`/api/admin/users/${targetId}`, { role: 'viewer', version: 0 }),
      (c: ApiClient) => c.post(`/api/admin/users/${targetId}/invite`),
    ]
    for (const call of calls) {
      expectErrorAnswer(await call(clients.anonymous), 401)
      for (const role of ['viewer', 'biologist', 'manager'] as const) expectErrorAnswer(await call(clients[role]), 403, /needs administrator/)
      expectErrorAnswer(await call(clients.otherAdmin), 404, /User not found/)
    }
    // The record was not touched by any of them.
    const row = await server.db.query('SELECT role, version FROM users WHERE id = $1', [targetId])
    expect(row.rows[0]).toMatchObject({ role: 'biologist', version: 0 })
  })

  it('PATCH /api/admin/agency: only administrators, each on their own agency', async () => {
    expectErrorAnswer(await clients.anonymous.patch('/api/admin/agency', { name: 'X', shortName: 'X', version: 0 }), 401)
    for (const role of ['viewer', 'biologist', 'manager'] as const) {
      expectErrorAnswer(await clients[role].patch('/api/admin/agency', { name: 'X', shortName: 'X', version: 0 }), 403)
    }
    const mine = (await clients.otherAdmin.get('/api/admin/agency')).body
    expect(mine.id).toBe(other.agencyId)
    const changed = await clients.otherAdmin.patch('/api/admin/agency', { name: mine.name, shortName: 'WBFO-2', version: mine.version })
    expect(changed.status).toBe(200)
    const demoAgency = (await clients.administrator.get('/api/admin/agency')).body
    expect(demoAgency.shortName).not.toBe('WBFO-2')
  })

  it('another agency\'s administrator sees only their own users and e-mails', async () => {
    const users = await clients.otherAdmin.get('/api/admin/users')
    const emails: string[] = users.body.items.map((u: { email: string }) => u.email)
    expect(emails).toEqual(expect.arrayContaining([other.adminEmail, other.biologistEmail]))
    for (const email of Object.values(demo)) expect(emails).not.toContain(email)
    const inOtherAgency = await server.db.query('SELECT email FROM users WHERE agency_id = $1', [other.agencyId])
    expect(emails.sort()).toEqual(inOtherAgency.rows.map(r => r.email as string).sort())
    const outbox = await clients.otherAdmin.get('/api/admin/outbox')
    const ownMail = await server.db.query('SELECT id FROM outbox_messages WHERE agency_id = $1', [other.agencyId])
    expect(outbox.body.items.map((m: { id: number }) => m.id).sort()).toEqual(ownMail.rows.map(r => r.id as number).sort())
    for (const message of outbox.body.items) expect(message.to).not.toMatch(/@demo\.tributary\.test$/)
    const demoUsers = await clients.administrator.get('/api/admin/users')
    expect(demoUsers.body.items.map((u: { email: string }) => u.email)).not.toContain(other.adminEmail)
  })

  it('the demo administrator cannot reach the other agency\'s users either', async () => {
    expectErrorAnswer(await clients.administrator.patch(`/api/admin/users/${other.biologistId}`, { role: 'viewer', version: 0 }), 404)
    expectErrorAnswer(await clients.administrator.post(`/api/admin/users/${other.biologistId}/invite`), 404)
  })
})

describe('account routes', () => {
  it('GET /api/me: 401 anonymous, 200 for every signed-in role with their own agency', async () => {
    expectErrorAnswer(await clients.anonymous.get('/api/me'), 401)
    for (const caller of CALLERS.filter(c => c !== 'anonymous')) {
      const me = await clients[caller].get('/api/me')
      expect(me.status, caller).toBe(200)
      expect(me.body.agency.id === other.agencyId).toBe(caller === 'otherAdmin')
    }
  })

  it('POST /api/me/password: 401 anonymous; any role may change their own (wrong current → 422)', async () => {
    expectErrorAnswer(await clients.anonymous.post('/api/me/password', { currentPassword: 'x', newPassword: 'long enough phrase' }), 401)
    for (const caller of CALLERS.filter(c => c !== 'anonymous')) {
      const response = await clients[caller].post('/api/me/password', { currentPassword: 'not the password', newPassword: 'long enough phrase here' })
      expectErrorAnswer(response, 422, /current password/)
    }
  })

  it('public routes answer everyone (sign-in, sign-out, forgot, token check)', async () => {
    for (const caller of CALLERS) {
      const client = clients[caller]
      expect((await client.post('/api/auth/password/forgot', { email: 'nobody@nowhere.example' })).status).toBe(202)
      expectErrorAnswer(await client.get('/api/auth/tokens/unknown-token-value'), 404)
      expectErrorAnswer(await client.post('/api/auth/password/reset', { token: 'unknown-token-value', password: 'long enough phrase' }), 404)
      expectErrorAnswer(await client.post('/api/auth/invite/accept', { token: 'unknown-token-value', name: 'N', password: 'long enough phrase' }), 404)
    }
    const fresh = server.anonymous()
    expect((await fresh.post('/api/auth/logout')).status).toBe(200)
    expect((await fresh.post('/api/auth/login', { email: demo.viewer, password: 'tributary-demo' })).status).toBe(200)
  })
})
