/** GET /api/admin/agency → 200 AgencyProfileDto (the signed-in administrator's agency). */
import type { AgencyProfileDto } from '#shared/types/api'

export default defineEventHandler(async (event): Promise<AgencyProfileDto> => {
  const admin = await requireRole(event, 'administrator')
  const { models } = await useDb()
  const agency = await models.Agency.findByPk(admin.agencyId)
  if (!agency) throw notFound('Agency')
  return agencyProfileDto(agency)
})
