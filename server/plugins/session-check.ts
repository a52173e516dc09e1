/**
 * Keeps the client's view of the session honest. nuxt-auth-utils answers GET /api/_auth/session
 * (what `useUserSession()` reads) from the cookie alone; this hook checks the user against the
 * database first, like every API route does (server/utils/auth.ts `requireUser`):
 * - deactivated user, or sessions ended by a password change → the cookie is cleared and the
 *   answer has no user (the app shows the sign-in page);
 * - role or name changed by an administrator → the answer (and cookie) carry the new values.
 * When the database cannot be reached, the cookie's view is left as it is.
 */
import { defineNitroPlugin } from 'nitropack/runtime'

export default defineNitroPlugin(() => {
  sessionHooks.hook('fetch', async (session, event) => {
    if (!session.user) return
    try {
      session.user = await requireUser(event)
    } catch (error) {
      const status = (error as { statusCode?: unknown }).statusCode
      if (status === 401) {
        delete session.user
        delete session.loggedInAt
      }
    }
  })
})
