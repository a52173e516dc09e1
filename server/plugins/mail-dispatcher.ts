/**
 * Sends the outbox (server/utils/mail.ts `sendQueuedMail`) every 2 seconds, and at once when
 * a transaction that queued mail commits (`kickMailDispatcher`). One pass at a time per
 * process; other processes share the work safely (rows are claimed with SKIP LOCKED).
 * Stops on Nitro's `close` hook after the pass in progress ends.
 * Set TRIBUTARY_MAIL_DISPATCHER=off to run a process that never sends.
 */
import { defineNitroPlugin } from 'nitropack/runtime'
import { isDbUnavailable } from '../db/connection'

const POLL_INTERVAL_MS = 2_000
/** After failed passes, timer passes wait 2 s · 2^n (at most a minute); kicks still run at once. */
const MAX_FAILURE_BACKOFF_MS = 60_000
/** The same failure (e.g. database down) is logged at most once a minute. */
const LOG_REPEAT_MS = 60_000

export default defineNitroPlugin((nitroApp) => {
  if (process.env.TRIBUTARY_MAIL_DISPATCHER === 'off') return

  let stopped = false
  let current: Promise<void> | null = null
  let again = false
  let lastLogged = { message: '', at: 0 }
  let consecutiveFailures = 0
  let resumeAt = 0

  const logFailure = (error: unknown) => {
    const message = isDbUnavailable(error) ? 'database unreachable' : error instanceof Error ? error.message : String(error)
    const now = Date.now()
    if (message === lastLogged.message && now - lastLogged.at < LOG_REPEAT_MS) return
    lastLogged = { message, at: now }
    console.error(`[mail] sending pass failed: ${message}`)
  }

  const pass = () => {
    if (stopped) return
    if (current) {
      again = true
      return
    }
    current = (async () => {
      do {
        again = false
        try {
          await sendQueuedMail()
          lastLogged = { message: '', at: 0 }
          consecutiveFailures = 0
          resumeAt = 0
        } catch (error) {
          logFailure(error)
          again = false
          consecutiveFailures += 1
          resumeAt = Date.now() + Math.min(POLL_INTERVAL_MS * 2 ** consecutiveFailures, MAX_FAILURE_BACKOFF_MS)
        }
      } while (again && !stopped)
    })().finally(() => { current = null })
  }

  const timer = setInterval(() => {
    if (Date.now() >= resumeAt) pass()
  }, POLL_INTERVAL_MS)
  timer.unref?.()
  setMailDispatcherKick(pass)

  nitroApp.hooks.hook('close', async () => {
    stopped = true
    clearInterval(timer)
    setMailDispatcherKick(null)
    await current
    closeMailTransport()
  })
})
