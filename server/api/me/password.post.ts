/**
 * POST /api/me/password { currentPassword, newPassword } → 200 { message }.
 * 422 with an issue on `currentPassword` when it is wrong (counted like a failed sign-in, so
 * 429 after too many), on `newPassword` when it breaks the rules. Bumps `session_version`: every
 * other session ends, and this one is re-issued so it stays signed in.
 */
import { ChangePasswordSchema } from '#shared/schemas/auth'
import type { ApiMessage } from '#shared/types/api'

export default defineEventHandler(async (event): Promise<ApiMessage> => {
  const current = await requireUser(event)
  const { currentPassword, newPassword } = await readBodyWith(event, ChangePasswordSchema, { maxBytes: 16 * 1024 })
  const problem = await newPasswordProblem(newPassword, current.email)
  if (problem) throw unprocessable(`newPassword: ${problem}`, [{ path: 'newPassword', message: problem }])
  const keys = signInKeys(current.email, clientAddress(event))
  const { sequelize, models } = await useDb()

  const outcome = await sequelize.transaction(async (t) => {
    await lockSignInKey(t, keys.account)
    await assertSignInAllowed(t, keys)
    const user = await models.User.findByPk(current.id, { lock: t.LOCK.UPDATE, transaction: t })
    if (!user || user.passwordHash === null) throw unauthorized('Your session has ended. Please sign in again.')
    const matches = await passwordMatches(user.passwordHash, currentPassword)
    if (!matches) {
      await recordSignInAttempt(t, keys, false)
      return null
    }
    if (await passwordMatches(user.passwordHash, newPassword)) return 'same' as const
    user.passwordHash = await hashPassword(newPassword)
    user.sessionVersion += 1
    await user.save({ transaction: t })
    await retireUserTokens(t, user.id, new Date(), 'reset')
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'user.password_change',
      entityType: 'user', entityId: user.id, before: null, after: null,
    })
    return user
  })

  if (outcome === null) {
    const message = 'The current password is not correct.'
    throw unprocessable(`currentPassword: ${message}`, [{ path: 'currentPassword', message }])
  }
  if (outcome === 'same') {
    const message = 'The new password is the same as the current one. Choose a different one.'
    throw unprocessable(`newPassword: ${message}`, [{ path: 'newPassword', message }])
  }
  await startSession(event, sessionUserOf(outcome))
  return { message: 'Your password has been changed. You have been signed out on every other device.' }
})
