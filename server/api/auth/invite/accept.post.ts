/**
 * POST /api/auth/invite/accept { token, name, password } → 200 { user: SignedInUserDto } and
 * the session cookie. One-time: 404 unknown link, 410 used or expired; 422 when the password
 * breaks the rules. Sets name and password, activates the account and signs the person in.
 */
import { AcceptInviteSchema } from '#shared/schemas/auth'
import type { SignInResponse } from '#shared/types/api'

export default defineEventHandler(async (event): Promise<SignInResponse> => {
  const { token, name, password } = await readBodyWith(event, AcceptInviteSchema, { maxBytes: 16 * 1024 })
  const { sequelize, models } = await useDb()

  const user = await sequelize.transaction(async (t) => {
    const now = new Date()
    const row = await consumeUserToken(t, token, 'invite', now)
    const user = await models.User.findByPk(row.userId, { lock: t.LOCK.UPDATE, transaction: t })
    if (!user || user.passwordHash !== null) throw tokenRefusal('used', 'invite')
    const problem = await newPasswordProblem(password, user.email)
    if (problem) throw unprocessable(`password: ${problem}`, [{ path: 'password', message: problem }])
    const before = adminUserDto(user)
    user.name = name
    user.passwordHash = await hashPassword(password)
    user.active = true
    user.sessionVersion += 1
    user.lastSignInAt = now
    await user.save({ transaction: t })
    await retireUserTokens(t, user.id, now, 'invite')
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: user.id, action: 'user.invite_accept',
      entityType: 'user', entityId: user.id, before, after: adminUserDto(user),
    })
    return user
  })

  await startSession(event, sessionUserOf(user))
  return { user: signedInUserDto(user) }
})
