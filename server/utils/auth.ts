/**
 * Who is asking, and may they? Every protected route starts with one of:
 *
 *   const user = await requireUser(event)                           // any signed-in person
 *   const user = await requireRole(event, 'manager', 'administrator') // some roles only
 *
 * The session is nuxt-auth-utils' sealed cookie `{ user: { id, agencyId, email, name, role,
 * sessionVersion }, loggedInAt }`. The user row is read from the database on every request, so
 * a deactivated user, or a user whose `session_version` moved on (password changed, signed out
 * everywhere), is refused at once: the cookie is cleared and the answer is 401. Role and name
 * come from the row, not the cookie (the cookie is refreshed when they differ). The same query
 * reads the records' versions into `event.context.dataVersions` for `rememberedRead`; checks of
 * requests arriving together share one query (server/utils/user-check.ts).
 *
 * Sessions last runtimeConfig.session.maxAge (12 hours) from sign-in: the sealed cookie carries
 * that lifetime and is refused after it ("Your session has expired."). There is no separate idle
 * timeout. Signing in always starts a new session (`startSession`).
 *
 * Scope every query with `agencyScope(user)`; a record of another agency must answer 404.
 */
import { randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'
import type { User as UserModel } from '../db/models'
import type { Role } from '#shared/types/db'
import { sessionCookieName } from './session-settings'
import { checkUser } from './user-check'

/** The signed-in person as routes see it (fresh from the database). */
export interface CurrentUser {
  id: number
  agencyId: number
  email: string
  name: string
  role: Role
  sessionVersion: number
}

/** Roles in order of what they may do, for messages ("manager or administrator"). */
const ROLE_ORDER: readonly Role[] = ['viewer', 'biologist', 'manager', 'administrator']

/** The session payload for a user row. */
export function sessionUserOf(user: Pick<UserModel, 'id' | 'agencyId' | 'email' | 'name' | 'role' | 'sessionVersion'>): CurrentUser {
  return {
    id: user.id,
    agencyId: user.agencyId,
    email: user.email,
    name: user.name,
    role: user.role,
    sessionVersion: user.sessionVersion,
  }
}

/** "a", "a or b", "a, b or c" — roles listed from least to most powerful. */
export function listRoles(roles: readonly Role[]): string {
  const sorted = [...new Set(roles)].sort((a, b) => ROLE_ORDER.indexOf(a) - ROLE_ORDER.indexOf(b))
  if (sorted.length <= 1) return sorted.join('')
  return `${sorted.slice(0, -1).join(', ')} or ${sorted[sorted.length - 1]}`
}

/** The 403 message when `role` is not among `allowed`. */
export function roleRefusal(role: Role, allowed: readonly Role[]): string {
  return `Your role (${role}) cannot do this: it needs ${listRoles(allowed)}.`
}

function looksLikeSessionUser(value: unknown): value is CurrentUser {
  if (!value || typeof value !== 'object') return false
  const candidate = value as Record<string, unknown>
  return Number.isInteger(candidate.id) && Number.isInteger(candidate.agencyId) && Number.isInteger(candidate.sessionVersion)
}

/**
 * Starts (or replaces) the session of `user` on this response, as a new session: a new id and
 * creation time, never the one the browser came with (no session fixation). h3 would otherwise
 * re-read the request's cookie while re-creating the session and keep its id; so the incoming
 * session cookie is dropped from this request first.
 */
export async function startSession(event: H3Event, user: CurrentUser): Promise<void> {
  await clearUserSession(event)
  const name = sessionCookieName()
  const incoming = event.node.req.headers.cookie
  if (incoming) {
    const others = incoming.split(';').map(part => part.trim()).filter(part => part && !part.startsWith(`${name}=`))
    if (others.length > 0) event.node.req.headers.cookie = others.join('; ')
    else delete event.node.req.headers.cookie
  }
  await replaceUserSession(event, { user, loggedInAt: new Date().toISOString() })
}

/**
 * True when the request carried a session cookie that was not accepted (expired — older than
 * runtimeConfig.session.maxAge — or damaged): h3 then starts a new, empty session during this
 * request, so its creation time is not before `since`.
 */
function sentUnacceptedCookie(event: H3Event, since: number): boolean {
  const name = sessionCookieName()
  if (!getCookie(event, name)) return false
  const sessions = event.context.sessions as Record<string, { createdAt?: number }> | undefined
  return (sessions?.[name]?.createdAt ?? 0) >= since
}

/**
 * The signed-in user, loaded from the database; throws 401 when there is none or the session
 * ended. Memoised on the event, so several calls in one request read the row once.
 */
export async function requireUser(event: H3Event): Promise<CurrentUser> {
  const memo = event.context.currentUser as CurrentUser | undefined
  if (memo) return memo

  const before = Date.now()
  const session = await getUserSession(event)
  if (!session.user) {
    if (sentUnacceptedCookie(event, before)) throw unauthorized('Your session has expired or is no longer valid. Please sign in again.')
    throw unauthorized('Please sign in.')
  }
  if (!looksLikeSessionUser(session.user)) {
    await clearUserSession(event)
    throw unauthorized('Your session has ended. Please sign in again.')
  }
  const claimed = session.user
  const row = await checkUser(claimed.id)
  if (!row || !row.active || !row.hasPassword || row.agencyId !== claimed.agencyId || row.sessionVersion !== claimed.sessionVersion) {
    await clearUserSession(event)
    throw unauthorized('Your session has ended. Please sign in again.')
  }

  const fresh = sessionUserOf(row)
  if (fresh.email !== claimed.email || fresh.name !== claimed.name || fresh.role !== claimed.role) {
    await setUserSession(event, { user: fresh })
  }
  event.context.currentUser = fresh
  event.context.dataVersions = row.dataVersions
  return fresh
}

/** The signed-in user if their role is one of `roles`; 401 / 403 otherwise. */
export async function requireRole(event: H3Event, ...roles: Role[]): Promise<CurrentUser> {
  const user = await requireUser(event)
  if (!roles.includes(user.role)) throw forbidden(roleRefusal(user.role, roles))
  return user
}

/** `where` fragment that keeps a query inside the user's agency. */
export function agencyScope(user: Pick<CurrentUser, 'agencyId'>): { agencyId: number } {
  return { agencyId: user.agencyId }
}

let equaliserHash: Promise<string> | undefined

/**
 * A real scrypt hash of a random secret, verified against when the e-mail is unknown, so an
 * unknown address takes as long to refuse as a wrong password.
 */
export function timingEqualiserHash(): Promise<string> {
  equaliserHash ??= hashPassword(randomBytes(18).toString('base64url'))
  return equaliserHash
}

/** verifyPassword that answers false (instead of throwing) for a malformed stored hash. */
export async function passwordMatches(hash: string, password: string): Promise<boolean> {
  try {
    return await verifyPassword(hash, password)
  } catch {
    return false
  }
}
