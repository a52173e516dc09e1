/**
 * POST /api/admin/users/:id/invite → 200 AdminUserDto. Sends the invitation again with a new
 * 7-day link (earlier links stop working). 404 for a user of another agency; 409 when the person
 * has already accepted (they can use "Forgot password"). Administrators only.
 */
import type { AdminUserDto } from '#shared/types/api'

export default defineEventHandler(async (event): Promise<AdminUserDto> => {
  const admin = await requireRole(event, 'administrator')
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const { sequelize, models } = await useDb()

  return sequelize.transaction(async (t) => {
    const user = await models.User.findOne({ where: { id, ...agencyScope(admin) }, lock: t.LOCK.UPDATE, transaction: t })
    if (!user) throw notFound('User')
    if (user.passwordHash !== null) {
      throw conflict('This person has already accepted the invitation. If they cannot sign in, they can use "Forgot password".')
    }
    const before = adminUserDto(user)
    const now = new Date()
    user.invitedAt = now
    await user.save({ transaction: t })
    await sendInvitation(t, { user, inviterName: admin.name, now })
    const after = adminUserDto(user)
    await recordAudit(t, {
      agencyId: admin.agencyId, actorId: admin.id, action: 'user.invite_resend',
      entityType: 'user', entityId: user.id, before, after,
    })
    return after
  })
})
