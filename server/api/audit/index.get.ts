/**
 * GET /api/audit?entityType=&entityId=&actorId=&action=&from=&to=&page= → 200 AuditPageResponse
 *
 * The agency's audit log for administrators, newest first, 50 a page: filter by record (type,
 * and id — which also lists the rows that point at it), person, action and date range (UTC days,
 * both included). The answer also lists the record types, actions and people present, for the
 * filters. 403 for other roles; 422 for malformed filters.
 */
import { AuditQuerySchema, type AuditPageResponse } from '#shared/schemas/review'
import { AUDIT_PAGE_SIZE, auditFacets, auditPage } from '../../utils/review-audit'

export default defineEventHandler(async (event): Promise<AuditPageResponse> => {
  const admin = await requireRole(event, 'administrator')
  const query = getQueryWith(event, AuditQuerySchema)
  const [{ items, total }, facets] = await Promise.all([auditPage(admin.agencyId, query), auditFacets(admin.agencyId)])
  return { items, page: query.page, pageSize: AUDIT_PAGE_SIZE, total, ...facets }
})
