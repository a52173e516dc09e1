/**
 * The proposals list (GET /api/proposals) with its filters — status, recipient, "only mine" —
 * kept in the page's URL query so a filtered list can be bookmarked and shared.
 */
import type { ProposalListResponse, ProposalSummaryDto } from '#shared/schemas/proposal'
import { PROPOSAL_STATUSES } from '#shared/types/db'
import type { ProposalStatus } from '#shared/types/db'

export interface ProposalListFilters {
  status: ProposalStatus | ''
  recipientId: number | null
  mine: boolean
}

export function useProposalList() {
  const route = useRoute()
  const router = useRouter()
  const filters = computed<ProposalListFilters>(() => {
    const status = String(route.query.status ?? '')
    const recipient = Number(route.query.recipientId)
    return {
      status: (PROPOSAL_STATUSES as readonly string[]).includes(status) ? status as ProposalStatus : '',
      recipientId: Number.isInteger(recipient) && recipient > 0 ? recipient : null,
      mine: route.query.mine === 'true',
    }
  })
  const query = computed(() => ({
    ...(filters.value.status ? { status: filters.value.status } : {}),
    ...(filters.value.recipientId ? { recipientId: String(filters.value.recipientId) } : {}),
    ...(filters.value.mine ? { mine: 'true' } : {}),
  }))
  const request = useFetch('/api/proposals', {
    key: 'proposal-list',
    query,
    transform: (answer: ProposalListResponse) => answer.items,
    default: () => [] as ProposalSummaryDto[],
  })
  function setFilters(next: Partial<ProposalListFilters>): void {
    const merged = { ...filters.value, ...next }
    void router.replace({
      query: {
        ...(merged.status ? { status: merged.status } : {}),
        ...(merged.recipientId ? { recipientId: String(merged.recipientId) } : {}),
        ...(merged.mine ? { mine: 'true' } : {}),
      },
    })
  }
  return { ...request, filters, setFilters }
}
