/**
 * GET /api/admin/agency/logo → the letterhead logo image (PNG or JPEG), or 404 when none was
 * uploaded; `?info=1` → 200 AgencyLogoDto instead. Administrators only.
 */
import { z } from 'zod'
import { QueryTypes } from 'sequelize'

const Query = z.object({ info: z.enum(['0', '1'], { error: 'info is 0 or 1.' }).optional() })

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'administrator')
  const { info } = getQueryWith(event, Query)
  if (info === '1') return loadAgencyLogo(admin.agencyId)
  const { sequelize } = await useDb()
  const rows = await sequelize.query<{ content_type: string, bytes: Buffer }>(
    'SELECT content_type, bytes FROM agency_logos WHERE agency_id = :agencyId',
    { replacements: { agencyId: admin.agencyId }, type: QueryTypes.SELECT },
  )
  const row = rows[0]
  if (!row) throw notFound('Logo')
  setResponseHeader(event, 'content-type', row.content_type)
  setResponseHeader(event, 'cache-control', 'private, no-store')
  setResponseHeader(event, 'x-content-type-options', 'nosniff')
  return Buffer.from(row.bytes)
})
