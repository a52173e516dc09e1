/**
 * Mail pieces without a server: the retry schedule (server/utils/mail.ts) and the capturing
 * SMTP server (scripts/mail-catcher-lib.ts) receiving a real nodemailer message.
 */
import nodemailer from 'nodemailer'
import { describe, expect, it } from 'vitest'
import { startMailCatcher } from '../../../scripts/mail-catcher-lib'
import { MAX_SEND_ATTEMPTS, firstRetryDelayMs, retryDelayMs } from '../../../server/utils/mail'

describe('retryDelayMs', () => {
  it('takes its first delay from TRIBUTARY_MAIL_FIRST_RETRY_SECONDS (whole seconds 1 … 3600), else 30 s', () => {
    expect(firstRetryDelayMs({})).toBe(30_000)
    expect(firstRetryDelayMs({ TRIBUTARY_MAIL_FIRST_RETRY_SECONDS: '1' })).toBe(1_000)
    for (const ignored of ['0', '-5', '1.5', '3601', 'soon', '']) expect(firstRetryDelayMs({ TRIBUTARY_MAIL_FIRST_RETRY_SECONDS: ignored })).toBe(30_000)
  })
  it('doubles from 30 s and stops at one hour', () => {
    expect([1, 2, 3, 4, 5, 6, 7].map(retryDelayMs)).toEqual([30, 60, 120, 240, 480, 960, 1920].map(s => s * 1000))
    expect(retryDelayMs(8)).toBe(3_600_000)
    expect(retryDelayMs(1000)).toBe(3_600_000)
    expect(retryDelayMs(0)).toBe(30_000)
  })
  it('gives up after 8 attempts (about an hour of retries in all)', () => {
    expect(MAX_SEND_ATTEMPTS).toBe(8)
    const totalSeconds = Array.from({ length: MAX_SEND_ATTEMPTS - 1 }, (_, i) => retryDelayMs(i + 1)).reduce((a, b) => a + b, 0) / 1000
    expect(totalSeconds).toBe(3810)
  })
})

describe('startMailCatcher', () => {
  it('captures a message on loopback and lists it over HTTP; DELETE forgets it', async () => {
    const catcher = await startMailCatcher({ smtpPort: 0, httpPort: 0 })
    try {
      const transport = nodemailer.createTransport({ host: '127.0.0.1', port: catcher.smtpPort, secure: false, auth: { user: 'any', pass: 'thing' } })
      await transport.sendMail({
        from: 'Tributary <no-reply@tributary.test>',
        to: 'Someone@Example.org',
        subject: 'Checking',
        text: 'Open http://localhost:3000/reset-password?token=abc',
        attachments: [{ filename: 'note.txt', content: 'hello' }],
      })
      transport.close()
      const listed = await (await fetch(`http://127.0.0.1:${catcher.httpPort}/messages`)).json()
      expect(listed).toEqual([{
        id: '1',
        to: ['someone@example.org'],
        from: expect.stringContaining('no-reply@tributary.test'),
        subject: 'Checking',
        text: expect.stringContaining('reset-password?token=abc'),
        html: null,
        date: expect.stringMatching(/^\d{4}-\d\d-\d\dT/),
        attachments: [{ filename: 'note.txt', contentType: 'text/plain', size: 5 }],
      }])
      expect((await fetch(`http://127.0.0.1:${catcher.httpPort}/messages`, { method: 'DELETE' })).status).toBe(204)
      expect(catcher.messages()).toEqual([])
      expect((await fetch(`http://127.0.0.1:${catcher.httpPort}/other`)).status).toBe(404)
    } finally {
      await catcher.close()
    }
  })
})
