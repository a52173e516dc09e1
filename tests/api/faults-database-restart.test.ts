/**
 * Fault: PostgreSQL stops and starts again while requests are running.
 *
 * The file has a PostgreSQL cluster of its own (useServer({ pg: 'private' })) — the shared
 * server is never touched. Steady traffic (reads, and invitations that write four rows in one
 * transaction: user, invitation token, outbox e-mail, audit event) runs while the database is
 * stopped with a fast shutdown (open sessions get 57P01, new connections ECONNREFUSED) and
 * started again. Checked:
 * - every answer is 2xx or a 503 with a plain JSON message and a Retry-After header: never a
 *   500, never a dropped connection; /api/health says 503 while the database is away;
 * - the same app process (same pid, no restart) answers normally once the database is back;
 * - no half-written invitation: each one is wholly there (all four rows) or wholly absent, and
 *   every invitation answered 201 is wholly there.
 */
import { afterAll, describe, expect, it } from 'vitest'
import type { ApiClient, ApiResponse } from '../support/client'
import { demo, eventually, useServer } from '../support/server'

const server = useServer({ pg: 'private' })

interface Answer {
  kind: 'subpopulations' | 'users' | 'invite'
  email?: string
  status: number | 'network error'
  message?: unknown
  retryAfter: string | null
  /** Phase of the outage in which the request was sent. */
  phase: Phase
}
type Phase = 'before' | 'down' | 'after'

const answers: Answer[] = []
let phase: Phase = 'before'
let trafficRunning = true
let traffic: Promise<void> | undefined

afterAll(async () => {
  trafficRunning = false
  await traffic
})

/** One request of the mix, chosen by its sequence number (deterministic order). */
async function oneRequest(admin: ApiClient, viewer: ApiClient, sequence: number): Promise<void> {
  const sentIn = phase
  const kind = (['subpopulations', 'users', 'invite'] as const)[sequence % 3]!
  const email = kind === 'invite' ? `restart.probe.${sequence}@demo.tributary.test` : undefined
  let response: ApiResponse
  try {
    if (kind === 'subpopulations') response = await viewer.get('/api/subpopulations')
    else if (kind === 'users') response = await admin.get('/api/admin/users')
    else response = await admin.post('/api/admin/users', { email, name: `Restart probe ${sequence}`, role: 'viewer' })
  } catch {
    answers.push({ kind, email, status: 'network error', retryAfter: null, phase: sentIn })
    return
  }
  answers.push({ kind, email, status: response.status, message: response.body?.message, retryAfter: response.headers.get('retry-after'), phase: sentIn })
}

/** Four clients' worth of requests in a loop until the test says stop. */
function startTraffic(admin: ApiClient, viewer: ApiClient): Promise<void> {
  let sequence = 0
  const lane = async () => {
    while (trafficRunning) await oneRequest(admin, viewer, sequence++)
  }
  return Promise.all([lane(), lane(), lane(), lane()]).then(() => undefined)
}

const countIn = (wanted: Phase, ok: (a: Answer) => boolean) => answers.filter(a => a.phase === wanted && ok(a)).length
const succeeded = (a: Answer) => a.status === 200 || a.status === 201

async function invitationRows(email: string) {
  const result = await server.db.query<{ users: number, tokens: number, mails: number, audits: number }>(`
    SELECT (SELECT count(*) FROM users WHERE email = $1)::int AS users,
           (SELECT count(*) FROM user_tokens t JOIN users u ON u.id = t.user_id WHERE u.email = $1)::int AS tokens,
           (SELECT count(*) FROM outbox_messages WHERE to_address = $1)::int AS mails,
           (SELECT count(*) FROM audit_events WHERE action = 'user.invite' AND after->>'email' = $1)::int AS audits`, [email])
  return result.rows[0]!
}

describe('PostgreSQL restarted while requests run', () => {
  it('answers 503 with a message while it is down, recovers without an app restart, leaves nothing half-written', async () => {
    const admin = await server.signIn(demo.admin)
    const viewer = await server.signIn(demo.viewer)
    const pid = server.pid()
    traffic = startTraffic(admin, viewer)

    await eventually(async () => countIn('before', succeeded) >= 12)
    phase = 'down'
    await server.postgres!.stop()

    // While it is down: the same requests answer 503, and so does the health check.
    await eventually(async () => countIn('down', a => a.status === 503) >= 12)
    const health = await server.anonymous().get('/api/health')
    expect(health.status).toBe(503)
    expect(health.body).toMatchObject({ ok: false, database: 'unreachable', message: expect.stringMatching(/database.*try again in a moment/i) })
    expect(Number(health.headers.get('retry-after'))).toBeGreaterThan(0)
    const read = await viewer.get('/api/subpopulations')
    expect(read.status).toBe(503)
    expect(read.body).toEqual({ message: 'The database is not reachable right now; try again in a moment.' })
    expect(read.headers.get('content-type')).toMatch(/application\/json/)
    expect(Number(read.headers.get('retry-after'))).toBeGreaterThan(0)

    await server.postgres!.start()
    phase = 'after'
    await eventually(async () => (await server.anonymous().get('/api/health')).status === 200, 30_000)
    await eventually(async () => countIn('after', succeeded) >= 12, 30_000)
    trafficRunning = false
    await traffic

    // Same process throughout; sessions made before the outage still work.
    expect(server.pid()).toBe(pid)
    expect((await viewer.get('/api/subpopulations')).status).toBe(200)

    const unexpected = answers.filter(a => !succeeded(a) && a.status !== 503)
    expect(unexpected, JSON.stringify(unexpected.slice(0, 5))).toEqual([])
    for (const answer of answers.filter(a => a.status === 503)) {
      expect(answer.message).toBe('The database is not reachable right now; try again in a moment.')
      expect(Number(answer.retryAfter)).toBeGreaterThan(0)
    }
    // Requests sent after the database was back all succeeded once health said so.
    expect(countIn('down', a => a.status === 503)).toBeGreaterThanOrEqual(12)

    // Invitations: all four rows or none; all four for every 201.
    const invitations = answers.filter(a => a.kind === 'invite')
    expect(invitations.some(a => a.status === 201)).toBe(true)
    expect(invitations.some(a => a.status === 503)).toBe(true)
    for (const invitation of invitations) {
      const rows = await invitationRows(invitation.email!)
      const whole = rows.users === 1 && rows.tokens === 1 && rows.mails === 1 && rows.audits === 1
      const absent = rows.users === 0 && rows.tokens === 0 && rows.mails === 0 && rows.audits === 0
      expect(whole || absent, `${invitation.email} answered ${invitation.status}: ${JSON.stringify(rows)}`).toBe(true)
      if (invitation.status === 201) expect(whole, `${invitation.email} answered 201 but ${JSON.stringify(rows)}`).toBe(true)
    }
    console.info(`[faults] ${answers.length} requests: ${countIn('before', succeeded)} ok before, ${countIn('down', a => a.status === 503)} × 503 while down, ${countIn('after', succeeded)} ok after`)
  }, 120_000)
})
