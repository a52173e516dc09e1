/**
 * PATCH /api/admin/users/:id { role?, active?, version } → 200 AdminUserDto.
 * 404 for a user of another agency; 409 when `version` is not the current one (someone else
 * changed the user since it was loaded); 422 when administrators try to remove their own
 * administrator role or deactivate themselves. Deactivating ends the user's sessions and
 * retires their pending links. Administrators only.
 */
import { UpdateUserSchema } from '#shared/schemas/users'
import type { AdminUserDto } from '#shared/types/api'

export default defineEventHandler(async (event): Promise<AdminUserDto> => {
  const admin = await requireRole(event, 'administrator')
  const { id } = getParamsWith(event, RecordIdParamsSchema)
  const input = await readBodyWith(event, UpdateUserSchema, { maxBytes: 16 * 1024 })
  const { sequelize, models } = await useDb()

  return sequelize.transaction(async (t) => {
    const user = await models.User.findOne({ where: { id, ...agencyScope(admin) }, lock: t.LOCK.UPDATE, transaction: t })
    if (!user) throw notFound('User')
    if (user.version !== input.version) {
      throw conflict(`Someone else changed this user since you loaded it (you had version ${input.version}, it is now ${user.version}). Reload and try again.`)
    }
    if (user.id === admin.id && ((input.role !== undefined && input.role !== 'administrator') || input.active === false)) {
      throw unprocessable('You cannot remove your own administrator role or deactivate yourself. Ask another administrator to do it.')
    }
    const before = adminUserDto(user)
    if (input.role !== undefined) user.role = input.role
    if (input.active !== undefined && input.active !== user.active) {
      user.active = input.active
      if (!input.active) {
        user.sessionVersion += 1
        await retireUserTokens(t, user.id)
      }
    }
    if (!user.changed()) return before
    await user.save({ transaction: t })
    const after = adminUserDto(user)
    await recordAudit(t, {
      agencyId: admin.agencyId, actorId: admin.id, action: 'user.update',
      entityType: 'user', entityId: user.id, before, after,
    })
    return after
  })
})
