import type { MeResponse } from '#shared/types/api'
import type { RoleName } from './useRoles'

/**
 * The signed-in user as the server knows them now (GET /api/me), including
 * the agency name, which the sealed session cookie does not carry. Shared by
 * key 'current-user', so the shell and pages read one request; call
 * `clearNuxtData('current-user')` after sign-in/out.
 */
export interface CurrentUser {
  id: number
  email: string
  name: string
  role: RoleName
  agencyId: number
  agencyName: string
  agencyShortName: string
}

export function useCurrentUser() {
  const { loggedIn } = useUserSession()
  const request = useRequestFetch()
  return useAsyncData<CurrentUser | null>('current-user', async () => {
    if (!loggedIn.value) return null
    const { user, agency } = await request<MeResponse>('/api/me')
    return {
      id: user.id, email: user.email, name: user.name, role: user.role,
      agencyId: user.agencyId, agencyName: agency.name, agencyShortName: agency.shortName,
    }
  }, { watch: [loggedIn], default: () => null })
}
