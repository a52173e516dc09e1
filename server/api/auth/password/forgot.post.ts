/**
 * POST /api/auth/password/forgot { email } → 202 { message }, always the same answer, so the
 * form does not reveal which addresses have accounts. For an active account with a password,
 * issues a one-hour reset token and queues the e-mail with the link
 * `${appUrl}/reset-password?token=…` (at most 3 such e-mails per account per hour).
 */
import { Op } from 'sequelize'
import { ForgotPasswordSchema } from '#shared/schemas/auth'
import type { ApiMessage } from '#shared/types/api'

const MAX_RESETS_PER_HOUR = 3
const ANSWER = 'If an account uses that address, we have sent it a link to choose a new password. The link works for one hour.'

export default defineEventHandler(async (event): Promise<ApiMessage> => {
  const { email } = await readBodyWith(event, ForgotPasswordSchema, { maxBytes: 16 * 1024 })
  const { sequelize, models } = await useDb()

  await sequelize.transaction(async (t) => {
    const user = await models.User.findOne({ where: { email }, lock: t.LOCK.UPDATE, transaction: t })
    if (!user || !user.active || user.passwordHash === null) return
    const now = new Date()
    const recent = await models.UserToken.count({
      where: { userId: user.id, purpose: 'reset', createdAt: { [Op.gt]: new Date(now.getTime() - 60 * 60_000) } },
      transaction: t,
    })
    if (recent >= MAX_RESETS_PER_HOUR) return
    const agency = await models.Agency.findByPk(user.agencyId, { transaction: t })
    const token = await issueUserToken(t, user.id, 'reset', RESET_TOKEN_TTL_MS, now)
    const mail = passwordResetMail({
      agencyName: agency?.name ?? 'your agency',
      name: user.name,
      link: appLink('/reset-password', { token }),
      expiresAt: new Date(now.getTime() + RESET_TOKEN_TTL_MS),
    })
    await queueMail(t, { agencyId: user.agencyId, to: user.email, ...mail })
    await recordAudit(t, {
      agencyId: user.agencyId, actorId: null, action: 'user.password_reset_request',
      entityType: 'user', entityId: user.id, before: null, after: { email: user.email },
    })
  })

  setResponseStatus(event, 202)
  return { message: ANSWER }
})
