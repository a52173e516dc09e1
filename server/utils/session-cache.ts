/**
 * Unsealed sessions kept in memory, keyed by the sealed cookie value.
 *
 * Why: opening the sealed session cookie (iron: two PBKDF2 key derivations, AES-CBC and an HMAC
 * through WebCrypto) cost about a third of the server's time on a simple signed-in read under
 * load (`npm run load`). The sealed value is integrity-protected, so the same sealed string
 * always opens to the same session: remembering what it opened to is exactly as safe as opening
 * it again, as long as an entry is not used past the session's own expiry. Who the user is, and
 * whether their session is still valid (deactivation, password change, sign-out everywhere),
 * is still checked against the database on every request (server/utils/auth.ts).
 */

/** One remembered session: what h3 keeps in `event.context.sessions[name]`. */
export interface CachedSession {
  id: string
  createdAt: number
  data: Record<string, unknown>
}

interface Entry { session: CachedSession, expiresAt: number }

/** Largest number of remembered sessions; the oldest is forgotten first. */
export const SESSION_CACHE_SIZE = 5000
/** An entry is re-checked by opening the cookie again after this long, whatever the session's age. */
export const SESSION_CACHE_TTL_MS = 5 * 60_000

const entries = new Map<string, Entry>()

/**
 * The session a sealed cookie opened to, or undefined when not remembered or expired.
 * Returns a copy: handlers may change the session they are given.
 *
 * @param sealed - the cookie value as sent
 * @param now - current time, ms since the epoch
 */
export function rememberedSession(sealed: string, now = Date.now()): CachedSession | undefined {
  const entry = entries.get(sealed)
  if (!entry) return undefined
  if (now >= entry.expiresAt) {
    entries.delete(sealed)
    return undefined
  }
  return structuredClone(entry.session)
}

/**
 * Remembers what a sealed cookie opened to, until the earlier of its expiry (createdAt + maxAge)
 * and SESSION_CACHE_TTL_MS from now.
 *
 * @param sealed - the cookie value as sent
 * @param session - the opened session (copied)
 * @param maxAgeSeconds - the session lifetime configured for the app
 * @param now - current time, ms since the epoch
 */
export function rememberSession(sealed: string, session: CachedSession, maxAgeSeconds: number, now = Date.now()): void {
  const expiresAt = Math.min(session.createdAt + maxAgeSeconds * 1000, now + SESSION_CACHE_TTL_MS)
  if (!(expiresAt > now)) return
  if (entries.size >= SESSION_CACHE_SIZE) {
    const oldest = entries.keys().next().value
    if (oldest !== undefined) entries.delete(oldest)
  }
  entries.set(sealed, { session: structuredClone(session), expiresAt })
}

/** Forgets every remembered session (tests). */
export function forgetSessions(): void {
  entries.clear()
}
