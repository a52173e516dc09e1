/**
 * The users list of Administration → Users (GET /api/admin/users → { items })
 * and how a row's state reads. Mutations happen in the dialogs
 * (components/admin/*Dialog.vue), which ask the page to refresh this list.
 */
import type { AdminUserDto, AdminUserListResponse, UserStatus } from '#shared/types/api'

export type AdminUser = AdminUserDto
export type AdminUserState = UserStatus

/** The server states it (`status`); older answers without it are read from `active` and `invitedAt`/`lastSignInAt`. */
export function adminUserState(user: Pick<AdminUser, 'status' | 'active'>): AdminUserState {
  if (user.status) return user.status
  return user.active ? 'active' : 'deactivated'
}

/** The sentence shown when a save hits a newer version (HTTP 409). */
export const USER_CONFLICT_MESSAGE = 'Someone else changed this user — reload to see their change.'

export function useAdminUsers() {
  return useFetch('/api/admin/users', {
    key: 'admin-users',
    transform: (answer: AdminUserListResponse) => answer.items,
    default: () => [] as AdminUser[],
  })
}
