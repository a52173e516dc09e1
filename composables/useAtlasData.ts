/**
 * The Atlas's server data: the agency's species (GET /api/species) and the chosen species'
 * subpopulations (GET /api/subpopulations?speciesId=), refetched when the species changes,
 * plus the list as filtered and sorted by the store's settings.
 */
import type { SpeciesDto, SpeciesListResponse, SubpopulationDto, SubpopulationListResponse } from '#shared/atlas/types'
import { countByStatus, filterAndSortRecords } from '#shared/atlas/list'

export function useAtlasSpecies() {
  const request = useRequestFetch()
  return useAsyncData<SpeciesDto[]>('atlas-species', async () => (await request<SpeciesListResponse>('/api/species')).items, { default: () => [] })
}

export function useAtlasSubpopulations(speciesId: Ref<number | null>) {
  const request = useRequestFetch()
  const answer = useAsyncData<SubpopulationDto[]>('atlas-subpopulations', async () => {
    if (speciesId.value === null) return []
    const { items } = await request<SubpopulationListResponse>('/api/subpopulations', { query: { speciesId: speciesId.value } })
    return items
  }, { watch: [speciesId], default: () => [] })
  return answer
}

/** The list as shown: filtered and sorted (pure; shared/atlas/list.ts), with counts per status. */
export function useAtlasList(items: Ref<SubpopulationDto[]>) {
  const store = useAtlasStore()
  const shown = computed(() => filterAndSortRecords(items.value, store.query))
  const counts = computed(() => countByStatus(items.value))
  const byId = computed(() => new Map(items.value.map(item => [item.id, item])))
  return { shown, counts, byId }
}
