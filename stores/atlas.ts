/**
 * What the Atlas remembers while you move around the app: the species shown, the selected
 * and hovered subpopulation, the list's search, status filter and sort, and which panels are
 * open. Server data stays in useFetch (composables/useAtlasData.ts); this holds view state only.
 */
import { defineStore } from 'pinia'
import type { AtlasListQuery, AtlasSortKey } from '#shared/atlas/list'
import type { StatusKey } from '#shared/atlas/status'

export const useAtlasStore = defineStore('atlas', () => {
  const speciesId = ref<number | null>(null)
  const selectedId = ref<number | null>(null)
  const hoveredId = ref<number | null>(null)
  const search = ref('')
  const statuses = ref<StatusKey[]>([])
  const sort = ref<AtlasSortKey>('projectedInbreeding')
  const direction = ref<'asc' | 'desc'>('desc')
  const railOpen = ref(true)
  const legendOpen = ref(true)

  const query = computed<AtlasListQuery>(() => ({ search: search.value, statuses: statuses.value, sort: sort.value, direction: direction.value }))

  function toggleStatus(key: StatusKey): void {
    statuses.value = statuses.value.includes(key) ? statuses.value.filter(item => item !== key) : [...statuses.value, key]
  }

  /** Picks a sort key; picking the current one flips the direction. Names start A→Z, figures worst first. */
  function sortBy(key: AtlasSortKey): void {
    if (sort.value === key) {
      direction.value = direction.value === 'asc' ? 'desc' : 'asc'
      return
    }
    sort.value = key
    direction.value = key === 'name' || key === 'effectiveSize' || key === 'census' ? 'asc' : 'desc'
  }

  function select(id: number | null): void {
    selectedId.value = id
  }

  function chooseSpecies(id: number | null): void {
    if (speciesId.value === id) return
    speciesId.value = id
    selectedId.value = null
    hoveredId.value = null
  }

  function clearFilters(): void {
    search.value = ''
    statuses.value = []
  }

  return { speciesId, selectedId, hoveredId, search, statuses, sort, direction, railOpen, legendOpen, query, toggleStatus, sortBy, select, chooseSpecies, clearFilters }
})
