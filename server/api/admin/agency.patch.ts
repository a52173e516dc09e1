/**
 * PATCH /api/admin/agency { name, shortName, address?, contactEmail?, phone?, version } → 200
 * AgencyProfileDto. 409 when `version` is not the current one, or when another agency already
 * uses the name. Administrators only.
 */
import { Op, fn, col, where } from 'sequelize'
import { AgencyProfileSchema } from '#shared/schemas/agency'
import type { AgencyProfileDto } from '#shared/types/api'

export default defineEventHandler(async (event): Promise<AgencyProfileDto> => {
  const admin = await requireRole(event, 'administrator')
  const input = await readBodyWith(event, AgencyProfileSchema, { maxBytes: 16 * 1024 })
  const { sequelize, models } = await useDb()

  return sequelize.transaction(async (t) => {
    const agency = await models.Agency.findByPk(admin.agencyId, { lock: t.LOCK.UPDATE, transaction: t })
    if (!agency) throw notFound('Agency')
    if (agency.version !== input.version) {
      throw conflict(`Someone else changed the agency profile since you loaded it (you had version ${input.version}, it is now ${agency.version}). Reload and try again.`)
    }
    const clash = await models.Agency.findOne({
      where: { [Op.and]: [where(fn('lower', col('name')), input.name.toLowerCase()), { id: { [Op.ne]: agency.id } }] },
      transaction: t,
    })
    if (clash) throw conflict('Another agency already uses this name.')
    const before = agencyProfileDto(agency)
    agency.name = input.name
    agency.shortName = input.shortName
    if (input.address !== undefined) agency.address = input.address
    if (input.contactEmail !== undefined) agency.contactEmail = input.contactEmail
    if (input.phone !== undefined) agency.phone = input.phone
    if (!agency.changed()) return before
    await agency.save({ transaction: t })
    const after = agencyProfileDto(agency)
    await recordAudit(t, {
      agencyId: agency.id, actorId: admin.id, action: 'agency.update',
      entityType: 'agency', entityId: agency.id, before, after,
    })
    return after
  })
})
