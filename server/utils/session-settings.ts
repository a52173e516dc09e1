/**
 * The session settings nuxt-auth-utils uses, built once per process: runtimeConfig.session
 * (name, maxAge, cookie options) with NUXT_SESSION_PASSWORD taking precedence over the configured
 * password, as nuxt-auth-utils does. One place for the session cookie's name and settings, read
 * by requireUser / startSession (server/utils/auth.ts) and by the middleware that remembers
 * opened sessions (server/middleware/session-cache.ts).
 */
import type { SessionConfig } from 'h3'

/** nuxt-auth-utils' cookie name when runtimeConfig.session.name is not set. */
const DEFAULT_SESSION_NAME = 'nuxt-session'

let settings: SessionConfig | undefined

/** The session settings (memoised; the run-time configuration is read once per process). */
export function sessionSettings(): SessionConfig {
  if (!settings) {
    const runtime = useRuntimeConfig().session as SessionConfig
    settings = { ...runtime, name: runtime.name || DEFAULT_SESSION_NAME, password: process.env.NUXT_SESSION_PASSWORD || runtime.password }
  }
  return settings
}

/** Name of the session cookie. */
export function sessionCookieName(): string {
  return sessionSettings().name ?? DEFAULT_SESSION_NAME
}
