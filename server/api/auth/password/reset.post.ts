/**
 * POST /api/auth/password/reset { token, password } → 200 { message }.
 * One-time: 404 for an unknown link, 410 for a used or expired one; 422 when the password
 * breaks the rules (issues on `password`). Sets the password and bumps `session_version`, so
 * every existing session ends; the person signs in again with the new password.
 */
import { ResetPasswordSchema } from '#shared/schemas/auth'
import type { ApiMessage } from '#shared/types/api'

export default defineEventHandler(async (event): Promise<ApiMessage> => {
  const { token, password } = await readBodyWith(event, ResetPasswordSchema, { maxBytes: 16 * 1024 })
  const { sequelize, models } = await useDb()

  await sequelize.transaction(async (t) => {
    const now = new Date()
    const row = await consumeUserToken(t, token, 'reset', now)
    const user = await models.User.findByPk(row.userId, { lock: t.LOCK.UPDATE, transaction: t })
    if (!user || !user.active || user.passwordHash === null) throw tokenRefusal('used', 'reset')
    const problem = await newPasswordProblem(password, user.email)
    if (problem) throw unprocessable(`password: ${problem}`, [{ path: 'password', message: problem }])
    user.passwordHash = await hashPassword(password)
    user.sessionVersion += 1
    await user.save({ transaction: t })
    await retireUserTokens(t, user.id, now, 'reset')
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'user.password_reset',
      entityType: 'user', entityId: user.id, before: null, after: null,
    })
  })

  return { message: 'Your password has been changed. Sign in with the new password.' }
})
