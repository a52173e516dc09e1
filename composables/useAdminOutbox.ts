/**
 * One page of the Outbox (GET /api/admin/outbox?status=&page=), driven by the
 * route query so a filtered page can be linked and the Back button works.
 */
import { OUTBOX_STATUSES, type OutboxStatus } from '#shared/types/db'
import type { OutboxMessageDto, PagedResponse } from '#shared/types/api'

export type OutboxItem = OutboxMessageDto
export type OutboxPage = PagedResponse<OutboxMessageDto>

export function useAdminOutbox() {
  const route = useRoute()
  const filterStatus = computed(() => {
    const value = route.query.status
    return typeof value === 'string' && (OUTBOX_STATUSES as readonly string[]).includes(value) ? value as OutboxStatus : ''
  })
  const page = computed(() => {
    const value = Number(route.query.page)
    return Number.isInteger(value) && value > 0 ? value : 1
  })
  const query = computed(() => ({ ...(filterStatus.value ? { status: filterStatus.value } : {}), page: page.value }))
  const result = useFetch<OutboxPage>('/api/admin/outbox', { query, key: 'admin-outbox', default: (): OutboxPage => ({ items: [], total: 0, page: 1, pageSize: 25 }) })
  const pageSize = computed(() => result.data.value.pageSize || 25)
  const pageCount = computed(() => Math.max(1, Math.ceil(result.data.value.total / pageSize.value)))
  return { ...result, filterStatus, page, pageSize, pageCount }
}
