/**
 * Outgoing e-mail through an outbox table: the app never sends inline.
 *
 * - `queueMail(t, { agencyId, to, subject, text, html?, attachments? })` inserts an `outbox_messages` row in
 *   the caller's transaction (rolled back with it) and, after commit, kicks the dispatcher.
 * - `sendQueuedMail()` (run by server/plugins/mail-dispatcher.ts every 2 s and on each kick)
 *   claims due rows with `FOR UPDATE SKIP LOCKED` — several app processes never take the same
 *   row — marks them 'sending', sends them through nodemailer (runtimeConfig.smtp) and marks
 *   them 'sent', or back to 'queued' with an exponential backoff, or 'failed' after 8 attempts.
 *   Rows left 'sending' by a process that died are queued again after 10 minutes.
 */
import nodemailer, { type Transporter } from 'nodemailer'
import { QueryTypes, type Transaction } from 'sequelize'

/** Attempts before a message is marked 'failed'. */
export const MAX_SEND_ATTEMPTS = 8
/** First retry delay; doubles each attempt up to `MAX_RETRY_DELAY_MS`. */
const FIRST_RETRY_DELAY_MS = 30_000
const MAX_RETRY_DELAY_MS = 60 * 60_000
/** A row still 'sending' after this long belongs to a process that died. */
const STALE_SENDING_MS = 10 * 60_000
const LAST_ERROR_MAX_LENGTH = 1000

export interface MailToQueue {
  /** Agency the message belongs to (shown in that agency's Outbox); null for system mail. */
  agencyId: number | null
  to: string
  subject: string
  text: string
  html?: string | null
  /** Files to send with the message (kept in the outbox row until sent; keep them small). */
  attachments?: { filename: string, contentType: string, content: Buffer }[]
}

export interface SmtpSettings {
  host: string
  port: number
  secure: boolean
  user: string
  pass: string
  from: string
}

/**
 * Delay before the next attempt after `attempt` failed attempts (1-based):
 * the first delay (30 s, or TRIBUTARY_MAIL_FIRST_RETRY_SECONDS) · 2^(attempt−1), at most one hour.
 *
 * @example retryDelayMs(1) // 30000
 * @example retryDelayMs(3) // 120000
 * @example retryDelayMs(20) // 3600000
 */
export function retryDelayMs(attempt: number): number {
  const exponent = Math.max(0, Math.min(attempt - 1, 30))
  return Math.min(firstRetryDelayMs() * 2 ** exponent, MAX_RETRY_DELAY_MS)
}

/**
 * The first retry delay in use: TRIBUTARY_MAIL_FIRST_RETRY_SECONDS (1 … 3600; the fault tests
 * set 1 so an SMTP outage and recovery fit in seconds), else 30 s.
 */
export function firstRetryDelayMs(env: NodeJS.ProcessEnv = process.env): number {
  const seconds = Number(env.TRIBUTARY_MAIL_FIRST_RETRY_SECONDS)
  return Number.isInteger(seconds) && seconds >= 1 && seconds <= 3600 ? seconds * 1000 : FIRST_RETRY_DELAY_MS
}

let dispatcherKick: (() => void) | null = null

/** Registered by the dispatcher plugin: how to start a sending pass now. */
export function setMailDispatcherKick(kick: (() => void) | null): void {
  dispatcherKick = kick
}

/** Asks the dispatcher (if running in this process) to send without waiting for its timer. */
export function kickMailDispatcher(): void {
  dispatcherKick?.()
}

/** Adds a message to the outbox inside `transaction`; the dispatcher sends it after commit. */
export async function queueMail(transaction: Transaction, mail: MailToQueue): Promise<number> {
  const { models } = await useDb()
  const row = await models.OutboxMessage.create({
    agencyId: mail.agencyId,
    toAddress: mail.to,
    subject: mail.subject,
    textBody: mail.text,
    htmlBody: mail.html ?? null,
    attachments: (mail.attachments ?? []).map(file => ({ filename: file.filename, contentType: file.contentType, contentBase64: file.content.toString('base64') })),
    lastError: null,
    sentAt: null,
  }, { transaction })
  transaction.afterCommit(() => kickMailDispatcher())
  return row.id
}

let cachedTransport: { key: string, transport: Transporter } | null = null

/** The SMTP settings from runtimeConfig.smtp (NUXT_SMTP_HOST, _PORT, _SECURE, _USER, _PASS, _FROM). */
export function smtpSettings(): SmtpSettings {
  const smtp = (useRuntimeConfig().smtp ?? {}) as Partial<Record<keyof SmtpSettings, unknown>>
  return {
    host: String(smtp.host ?? '127.0.0.1'),
    port: Number(smtp.port ?? 2525),
    secure: smtp.secure === true || smtp.secure === 'true',
    user: String(smtp.user ?? ''),
    pass: String(smtp.pass ?? ''),
    from: String(smtp.from ?? 'Tributary <no-reply@tributary.test>'),
  }
}

function transportFor(settings: SmtpSettings): Transporter {
  const key = JSON.stringify(settings)
  if (cachedTransport?.key === key) return cachedTransport.transport
  cachedTransport?.transport.close()
  const transport = nodemailer.createTransport({
    host: settings.host,
    port: settings.port,
    secure: settings.secure,
    auth: settings.user ? { user: settings.user, pass: settings.pass } : undefined,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  })
  cachedTransport = { key, transport }
  return transport
}

/** Closes the cached SMTP transport (on shutdown). */
export function closeMailTransport(): void {
  cachedTransport?.transport.close()
  cachedTransport = null
}

interface ClaimedRow {
  id: number
  to_address: string
  subject: string
  text_body: string
  html_body: string | null
  attempts: number
  attachments: { filename: string, contentType: string, contentBase64: string }[] | null
}

export interface SendPassResult { sent: number, retrying: number, failed: number }

/**
 * Sends what is due. Claims up to `batchSize` rows at a time and repeats while rows keep coming
 * (at most `maxBatches` batches per call).
 */
export async function sendQueuedMail(options: { batchSize?: number, maxBatches?: number, settings?: SmtpSettings } = {}): Promise<SendPassResult> {
  const { sequelize } = await useDb()
  const settings = options.settings ?? smtpSettings()
  const result: SendPassResult = { sent: 0, retrying: 0, failed: 0 }

  await sequelize.query(
    `UPDATE outbox_messages SET status = 'queued', updated_at = now()
      WHERE status = 'sending' AND updated_at < now() - make_interval(secs => :staleSeconds)`,
    { replacements: { staleSeconds: STALE_SENDING_MS / 1000 } },
  )

  for (let batch = 0; batch < (options.maxBatches ?? 10); batch += 1) {
    const claimed = await sequelize.query<ClaimedRow>(
      `UPDATE outbox_messages AS o SET status = 'sending', updated_at = now()
         FROM (SELECT id FROM outbox_messages
                WHERE status = 'queued' AND next_attempt_at <= now()
                ORDER BY next_attempt_at, id
                LIMIT :batchSize
                FOR UPDATE SKIP LOCKED) AS due
        WHERE o.id = due.id
      RETURNING o.id, o.to_address, o.subject, o.text_body, o.html_body, o.attempts, o.attachments`,
      { replacements: { batchSize: options.batchSize ?? 20 }, type: QueryTypes.SELECT },
    )
    if (claimed.length === 0) break
    const transport = transportFor(settings)
    for (const row of claimed) {
      try {
        await transport.sendMail({
          from: settings.from,
          to: row.to_address,
          subject: row.subject,
          text: row.text_body,
          html: row.html_body ?? undefined,
          attachments: (row.attachments ?? []).map(file => ({ filename: file.filename, contentType: file.contentType, content: Buffer.from(file.contentBase64, 'base64') })),
        })
        await sequelize.query(
          `UPDATE outbox_messages SET status = 'sent', sent_at = now(), attempts = attempts + 1,
                  last_error = NULL, updated_at = now() WHERE id = :id`,
          { replacements: { id: row.id } },
        )
        result.sent += 1
      } catch (error) {
        const attempts = row.attempts + 1
        const finalAttempt = attempts >= MAX_SEND_ATTEMPTS
        const message = (error instanceof Error ? error.message : String(error)).slice(0, LAST_ERROR_MAX_LENGTH)
        await sequelize.query(
          `UPDATE outbox_messages SET status = :status, attempts = :attempts, last_error = :message,
                  next_attempt_at = now() + make_interval(secs => :delaySeconds), updated_at = now()
            WHERE id = :id`,
          { replacements: { id: row.id, status: finalAttempt ? 'failed' : 'queued', attempts, message, delaySeconds: finalAttempt ? 0 : retryDelayMs(attempts) / 1000 } },
        )
        if (finalAttempt) result.failed += 1
        else result.retrying += 1
      }
    }
  }
  return result
}
