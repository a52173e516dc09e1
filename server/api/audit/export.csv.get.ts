/**
 * GET /api/audit/export.csv?entityType=&entityId=&actorId=&action=&from=&to= → 200 text/csv
 *
 * Every audit event matching the filters (the same as GET /api/audit, without paging), newest
 * first, streamed in batches: id, time (UTC), actor name and e-mail, action, record type and id,
 * and the before / after snapshots as JSON. Administrators only.
 */
import { AuditQuerySchema } from '#shared/schemas/review'
import { auditCsvStream } from '../../utils/review-audit'

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'administrator')
  const { page: _page, ...filters } = getQueryWith(event, AuditQuerySchema)
  const day = new Date().toISOString().slice(0, 10)
  setResponseHeaders(event, {
    'content-type': 'text/csv; charset=utf-8',
    'content-disposition': `attachment; filename="audit-log-${day}.csv"`,
    'cache-control': 'no-store',
  })
  return sendStream(event, auditCsvStream(admin.agencyId, filters))
})
