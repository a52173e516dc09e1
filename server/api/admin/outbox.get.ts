/**
 * GET /api/admin/outbox?status=queued|sending|sent|failed&page=1 → 200
 * PagedResponse<OutboxMessageDto> (25 a page, newest first, with bodies) — the agency's
 * e-mails. Administrators only.
 */
import { OutboxQuerySchema } from '#shared/schemas/users'
import type { OutboxMessageDto, PagedResponse } from '#shared/types/api'

const PAGE_SIZE = 25

export default defineEventHandler(async (event): Promise<PagedResponse<OutboxMessageDto>> => {
  const admin = await requireRole(event, 'administrator')
  const { status, page } = getQueryWith(event, OutboxQuerySchema)
  const { models } = await useDb()
  const { rows, count } = await models.OutboxMessage.findAndCountAll({
    where: { ...agencyScope(admin), ...(status ? { status } : {}) },
    // The list never shows attachment contents (whole signed PDFs, base64): don't load them per page.
    attributes: { exclude: ['attachments'] },
    order: [['createdAt', 'DESC'], ['id', 'DESC']],
    limit: PAGE_SIZE,
    offset: (page - 1) * PAGE_SIZE,
  })
  return { items: rows.map(outboxMessageDto), page, pageSize: PAGE_SIZE, total: count }
})
