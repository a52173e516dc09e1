/**
 * The Atlas list: search, filter by status and sort, as pure functions over the records the
 * page already holds (so the list and the map stay in step without asking the server).
 * Linear in the number of records for the filter, n·log n for the sort; see
 * bench/atlas.bench.ts for timings at 1,000 records.
 */
import type { StatusKey } from './status'

/** What the list sorts by. */
export type AtlasSortKey = 'name' | 'effectiveSize' | 'projectedInbreeding' | 'census'

/** Sort choices in the order the list offers them. */
export const ATLAS_SORT_OPTIONS: readonly { key: AtlasSortKey, label: string }[] = [
  { key: 'name', label: 'Name' },
  { key: 'projectedInbreeding', label: 'Projected F' },
  { key: 'effectiveSize', label: 'Working Ne' },
  { key: 'census', label: 'Latest census' },
]

/** The list's settings. */
export interface AtlasListQuery {
  /** Words to find in the name or environment class (case and accents ignored). */
  search: string
  /** Statuses to show; empty shows all. */
  statuses: readonly StatusKey[]
  sort: AtlasSortKey
  direction: 'asc' | 'desc'
}

/** The fields of a record the list reads. */
export interface AtlasListRecord {
  id: number
  name: string
  environmentClass: string | null
  latestCensus: { adults: number } | null
  effectiveSize: { value: number | null }
  status: { key: StatusKey, projectedInbreeding: number | null }
}

/** One collator for every comparison (localeCompare with options builds one per call: 20× slower). */
const NAME_ORDER = new Intl.Collator('en', { sensitivity: 'base' })

/** Lower case without accents: 'Éclair Hollow' → 'eclair hollow'. */
export function foldText(text: string): string {
  return text.normalize('NFKD').replace(/[\u0300-\u036f]/g, '').toLowerCase()
}

function sortValue(record: AtlasListRecord, key: AtlasSortKey): number | string | null {
  switch (key) {
    case 'name': return record.name
    case 'effectiveSize': return record.effectiveSize.value
    case 'projectedInbreeding': return record.status.projectedInbreeding
    case 'census': return record.latestCensus?.adults ?? null
  }
}

/**
 * The records to show, in order. Records without the sorted figure go last in either
 * direction; ties fall back to the name, then the id, so the order is stable.
 *
 * @param records - all records of the species
 * @param query - search words, statuses, sort key and direction
 * @returns a new array (the input is not changed)
 * @example filterAndSortRecords(records, { search: 'fern', statuses: ['critical'], sort: 'name', direction: 'asc' })
 */
export function filterAndSortRecords<T extends AtlasListRecord>(records: readonly T[], query: AtlasListQuery): T[] {
  const words = foldText(query.search).split(/\s+/).filter(Boolean)
  const statuses = new Set(query.statuses)
  const shown = records.filter((record) => {
    if (statuses.size && !statuses.has(record.status.key)) return false
    if (!words.length) return true
    const haystack = foldText(`${record.name} ${record.environmentClass ?? ''}`)
    return words.every(word => haystack.includes(word))
  })
  const sign = query.direction === 'asc' ? 1 : -1
  const byName = (a: T, b: T) => NAME_ORDER.compare(a.name, b.name) || a.id - b.id
  const keyed = shown.map(record => ({ record, value: sortValue(record, query.sort) }))
  keyed.sort((a, b) => {
    if (query.sort === 'name') return sign * byName(a.record, b.record)
    if (a.value === null || b.value === null) {
      if (a.value === b.value) return byName(a.record, b.record)
      return a.value === null ? 1 : -1
    }
    const difference = (a.value as number) - (b.value as number)
    return difference !== 0 ? sign * difference : byName(a.record, b.record)
  })
  return keyed.map(entry => entry.record)
}

/**
 * How many records have each status (for the filter chips).
 *
 * @example countByStatus([{ status: { key: 'watch' } }, { status: { key: 'watch' } }]).watch // 2
 */
export function countByStatus(records: readonly { status: { key: StatusKey } }[]): Record<StatusKey, number> {
  const counts: Record<StatusKey, number> = { critical: 0, declining: 0, watch: 0, stable: 0, connected: 0, unknown: 0 }
  for (const record of records) counts[record.status.key] += 1
  return counts
}
