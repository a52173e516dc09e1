/**
 * Opens the session cookie once per distinct sealed value (see server/utils/session-cache.ts):
 * a remembered session is placed where h3 looks for it (`event.context.sessions[name]`), so
 * nuxt-auth-utils' `getUserSession` does not open the cookie again; otherwise the cookie is
 * opened here with the same settings nuxt-auth-utils uses (server/utils/session-settings.ts) and
 * the result remembered.
 * A cookie that does not open (tampered, expired) is left to the handlers exactly as it came.
 */
import { getSession } from 'h3'
import { rememberedSession, rememberSession, type CachedSession } from '../utils/session-cache'
import { sessionCookieName, sessionSettings } from '../utils/session-settings'

export default defineEventHandler(async (event) => {
  const settings = sessionSettings()
  const name = sessionCookieName()
  const sealed = getCookie(event, name)
  if (!sealed) return
  const remembered = rememberedSession(sealed)
  if (remembered) {
    const sessions: Record<string, unknown> = event.context.sessions ??= Object.create(null)
    sessions[name] = remembered
    return
  }
  const session = await getSession(event, settings) as CachedSession
  const setCookies = [event.node.res.getHeader('set-cookie') ?? []].flat().map(String)
  if (setCookies.some(cookie => cookie.startsWith(`${name}=`))) {
    // The cookie did not open, so h3 started a new session and cookie: undo both and leave the
    // request exactly as it came, for the handlers to see (and word) the refused cookie themselves.
    delete event.context.sessions?.[name]
    const others = setCookies.filter(cookie => !cookie.startsWith(`${name}=`))
    if (others.length > 0) event.node.res.setHeader('set-cookie', others)
    else event.node.res.removeHeader('set-cookie')
    return
  }
  if (session.id && settings.maxAge) rememberSession(sealed, session, settings.maxAge)
})
