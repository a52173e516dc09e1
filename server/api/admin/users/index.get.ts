/**
 * GET /api/admin/users → 200 { items: AdminUserDto[] } — the agency's users, by name.
 * Administrators only.
 */
import type { AdminUserListResponse } from '#shared/types/api'

export default defineEventHandler(async (event): Promise<AdminUserListResponse> => {
  const admin = await requireRole(event, 'administrator')
  const { models } = await useDb()
  const users = await models.User.findAll({ where: agencyScope(admin), order: [['name', 'ASC'], ['id', 'ASC']] })
  return { items: users.map(adminUserDto) }
})
