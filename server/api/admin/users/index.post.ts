/**
 * POST /api/admin/users { email, name, role } → 201 AdminUserDto (status 'invited').
 * Creates the account without a password, issues a 7-day invitation token and queues the
 * invitation e-mail with the link `${appUrl}/accept-invite?token=…`. 409 when the address is
 * already in use (in any agency). Administrators only.
 */
import { InviteUserSchema } from '#shared/schemas/users'
import type { AdminUserDto } from '#shared/types/api'

export default defineEventHandler(async (event): Promise<AdminUserDto> => {
  const admin = await requireRole(event, 'administrator')
  const input = await readBodyWith(event, InviteUserSchema, { maxBytes: 16 * 1024 })
  const { sequelize, models } = await useDb()

  const user = await sequelize.transaction(async (t) => {
    const existing = await models.User.findOne({ where: { email: input.email }, transaction: t })
    if (existing) throw conflict('An account with this e-mail address already exists.')
    const now = new Date()
    const user = await models.User.create({
      agencyId: admin.agencyId,
      email: input.email,
      name: input.name,
      role: input.role,
      passwordHash: null,
      active: false,
      lastSignInAt: null,
      invitedAt: now,
    }, { transaction: t })
    await sendInvitation(t, { user, inviterName: admin.name, now })
    await recordAudit(t, {
      agencyId: admin.agencyId, actorId: admin.id, action: 'user.invite',
      entityType: 'user', entityId: user.id, before: null, after: adminUserDto(user),
    })
    return user
  })

  setResponseStatus(event, 201)
  return adminUserDto(user)
})
