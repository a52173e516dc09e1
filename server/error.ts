/**
 * Nitro error handler for the JSON API. Every error under /api/** answers
 * `{ message, issues? }` with the error's status (see `answerForError` in
 * server/utils/http-errors.ts): never a stack trace or internal detail. Unexpected errors are
 * logged in full on the server and answered 500 with a plain sentence; an unreachable database
 * answers 503. Page requests are left to Nuxt's own handler (the error page), which runs next.
 *
 * Registered in nuxt.config.ts ahead of Nuxt's handler (hooks['nitro:config']).
 */
import { defineNitroErrorHandler } from 'nitropack/runtime'

export default defineNitroErrorHandler((error, event) => {
  const path = event.path ?? ''
  if (path !== '/api' && !path.startsWith('/api/') && !path.startsWith('/api?')) return

  const answer = answerForError(error)
  const where = `${event.method} ${path.split('?')[0]}`
  if (answer.unexpected) console.error(`[api] ${where} failed:`, error)
  else if (answer.status === 503) console.warn(`[api] ${where}: database unreachable (${String(error.cause ?? error.message)})`)

  if (event.node?.res?.headersSent) return
  setResponseStatus(event, answer.status, answer.statusText)
  setResponseHeader(event, 'content-type', 'application/json; charset=utf-8')
  setResponseHeader(event, 'cache-control', 'no-store')
  setResponseHeader(event, 'x-content-type-options', 'nosniff')
  if (answer.retryAfterSeconds !== undefined) setResponseHeader(event, 'retry-after', Math.max(1, Math.ceil(answer.retryAfterSeconds)))
  if (answer.status === 503) setResponseHeader(event, 'retry-after', 5)
  const body: { message: string, issues?: typeof answer.issues } = { message: answer.message }
  if (answer.issues) body.issues = answer.issues
  return send(event, JSON.stringify(body))
})
