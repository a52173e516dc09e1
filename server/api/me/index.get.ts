/**
 * GET /api/me → 200 MeResponse { user: { id, agencyId, email, name, role, lastSignInAt },
 * agency: { id, name, shortName } }; 401 without a valid session.
 */
import type { MeResponse } from '#shared/types/api'

export default defineEventHandler(async (event): Promise<MeResponse> => {
  const current = await requireUser(event)
  const { models } = await useDb()
  const [user, agency] = await Promise.all([
    models.User.findByPk(current.id),
    models.Agency.findByPk(current.agencyId),
  ])
  if (!user || !agency) throw unauthorized('Your session has ended. Please sign in again.')
  return {
    user: { ...signedInUserDto(user), lastSignInAt: user.lastSignInAt ? user.lastSignInAt.toISOString() : null },
    agency: { id: agency.id, name: agency.name, shortName: agency.shortName },
  }
})
