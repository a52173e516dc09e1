/**
 * POST /api/auth/logout → 200 { message }. Ends this browser's session (other devices stay
 * signed in; changing the password ends those). Works without a session too.
 */
import type { ApiMessage } from '#shared/types/api'

export default defineEventHandler(async (event): Promise<ApiMessage> => {
  await clearUserSession(event)
  return { message: 'You are signed out.' }
})
