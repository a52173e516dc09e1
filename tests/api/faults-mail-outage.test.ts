/**
 * Fault: the SMTP server is down when the app has mail to send. The change that sends mail (an
 * invitation) still succeeds; its e-mail waits in the outbox as 'queued' with the connection
 * error noted and the dispatcher keeps retrying with backoff; when the SMTP server comes back on
 * the same port, the dispatcher delivers it once — no app restart, no manual step.
 *
 * TRIBUTARY_MAIL_FIRST_RETRY_SECONDS=1 shortens the first retry delay (30 s in production), so the
 * outage and the recovery fit in a few seconds.
 */
import { describe, expect, it } from 'vitest'
import { demo, eventually, useServer } from '../support/server'

const server = useServer({ env: { TRIBUTARY_MAIL_FIRST_RETRY_SECONDS: '1' } })

async function outboxRow(to: string) {
  const result = await server.db.query('SELECT * FROM outbox_messages WHERE to_address = $1', [to])
  expect(result.rows.length).toBeLessThanOrEqual(1)
  return result.rows[0]
}

describe('SMTP server down', () => {
  it('queues the mail with the error noted and delivers it once the server returns', async () => {
    const admin = await server.signIn(demo.admin)
    const email = 'smtp.outage@demo.tributary.test'
    const pid = server.pid()

    await server.mail.stop()
    let stopped = true
    try {
      const invited = await admin.post('/api/admin/users', { email, name: 'Outage Check', role: 'viewer' })
      expect(invited.status, JSON.stringify(invited.body)).toBe(201)

      // Tried, refused, and tried again later: still queued, with the reason.
      const retried = await eventually(async () => {
        const row = await outboxRow(email)
        return row && row.attempts >= 2 ? row : undefined
      })
      expect(retried.status).toBe('queued')
      expect(retried.sent_at).toBeNull()
      expect(retried.last_error).toMatch(/ECONNREFUSED|connect/i)
      expect(new Date(retried.next_attempt_at).getTime()).toBeGreaterThan(new Date(retried.created_at).getTime())

      // Administrators see it waiting, with the error, in the Outbox.
      const queued = await admin.get('/api/admin/outbox?status=queued')
      const listed = queued.body.items.find((m: { to: string }) => m.to === email)
      expect(listed).toMatchObject({ status: 'queued', sentAt: null, lastError: expect.stringMatching(/ECONNREFUSED|connect/i) })

      await server.mail.start()
      stopped = false
    } finally {
      if (stopped) await server.mail.start()
    }

    const sent = await eventually(async () => {
      const row = await outboxRow(email)
      return row?.status === 'sent' ? row : undefined
    }, 20_000)
    expect(sent.attempts).toBeGreaterThanOrEqual(3)
    expect(sent.last_error).toBeNull()
    expect(sent.sent_at).not.toBeNull()
    const delivered = (await server.mail.messages()).filter(m => JSON.stringify(m.to).includes(email))
    expect(delivered).toHaveLength(1)
    expect(delivered[0]!.subject).toMatch(/invited you to Tributary/)
    expect(delivered[0]!.text).toMatch(/accept-invite\?token=/)
    expect(server.pid()).toBe(pid)
  })
})
