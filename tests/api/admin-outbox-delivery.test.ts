/**
 * E-mail delivery through the outbox (server/utils/mail.ts, server/plugins/mail-dispatcher.ts):
 * a refused SMTP connection leaves the message queued with a later retry time and the error;
 * it goes out once SMTP works; the 8th failed attempt marks it failed.
 */
import { describe, expect, it } from 'vitest'
import { freePort } from '../support/ports'
import { demo, eventually, useServer } from '../support/server'

const server = useServer()

async function outboxRow(to: string) {
  const result = await server.db.query('SELECT * FROM outbox_messages WHERE to_address = $1 ORDER BY id DESC LIMIT 1', [to])
  return result.rows[0]
}

describe('outbox delivery', () => {
  it('retries with backoff while SMTP refuses, then sends; fails after the last attempt', async () => {
    const workingPort = server.env.NUXT_SMTP_PORT!
    await server.restart({ NUXT_SMTP_PORT: String(await freePort()) })

    const admin = await server.signIn(demo.admin)
    const email = 'delivery.check@demo.tributary.test'
    expect((await admin.post('/api/admin/users', { email, name: 'Delivery Check', role: 'viewer' })).status).toBe(201)

    const retrying = await eventually(async () => {
      const row = await outboxRow(email)
      return row && row.attempts >= 1 ? row : undefined
    })
    expect(retrying.status).toBe('queued')
    expect(retrying.last_error).toMatch(/ECONNREFUSED|connect/i)
    const delaySeconds = (new Date(retrying.next_attempt_at).getTime() - Date.now()) / 1000
    expect(delaySeconds).toBeGreaterThan(15)
    expect(delaySeconds).toBeLessThanOrEqual(31)

    // The last attempt: 7 done, the 8th fails too → failed for good.
    await server.db.query(`UPDATE outbox_messages SET attempts = 7, next_attempt_at = now() WHERE id = $1`, [retrying.id])
    const failed = await eventually(async () => {
      const row = await outboxRow(email)
      return row?.status === 'failed' ? row : undefined
    })
    expect(failed.attempts).toBe(8)

    // SMTP back: a message due now goes out.
    await server.restart({ NUXT_SMTP_PORT: workingPort })
    await server.db.query(`UPDATE outbox_messages SET status = 'queued', attempts = 3, next_attempt_at = now() WHERE id = $1`, [retrying.id])
    const sent = await eventually(async () => {
      const row = await outboxRow(email)
      return row?.status === 'sent' ? row : undefined
    })
    expect(sent.attempts).toBe(4)
    expect(sent.last_error).toBeNull()
    expect(sent.sent_at).not.toBeNull()
    const captured = await server.mail.messages()
    expect(captured.filter(m => JSON.stringify(m.to).includes(email))).toHaveLength(1)

    const listed = await (await server.signIn(demo.admin)).get('/api/admin/outbox?status=sent')
    expect(listed.body.items.some((m: { to: string }) => m.to === email)).toBe(true)
  })
})
