/**
 * GET /api/auth/tokens/:token → 200 TokenInfoResponse { purpose, email, name, agencyName,
 * expiresAt } while the link is valid; 404 unknown, 410 used or expired (with a message saying
 * what to do). Lets the invitation and reset pages greet the person before they type.
 */
import { TokenParamsSchema } from '#shared/schemas/auth'
import type { TokenInfoResponse } from '#shared/types/api'

export default defineEventHandler(async (event): Promise<TokenInfoResponse> => {
  const { token } = getParamsWith(event, TokenParamsSchema)
  const { models } = await useDb()
  const row = await findUserToken(token)
  const state = tokenState(row, new Date())
  if (state !== 'valid' || !row) throw tokenRefusal(state === 'valid' ? 'unknown' : state, row?.purpose)
  const user = await models.User.findByPk(row.userId)
  const usable = user && (row.purpose === 'invite' ? user.passwordHash === null : user.active && user.passwordHash !== null)
  if (!user || !usable) throw tokenRefusal('used', row.purpose)
  const agency = await models.Agency.findByPk(user.agencyId)
  return {
    purpose: row.purpose,
    email: user.email,
    name: user.name,
    agencyName: agency?.name ?? '',
    expiresAt: row.expiresAt.toISOString(),
  }
})
