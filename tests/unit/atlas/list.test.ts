/**
 * The Atlas list (shared/atlas/list.ts): search, status filter and sort, and that the list
 * and status computations on 1,000 records are pure (no input changed, same answer twice).
 * Timings are in bench/atlas.bench.ts, not here.
 */
import { describe, expect, it } from 'vitest'
import { countByStatus, filterAndSortRecords, foldText, type AtlasListQuery } from '../../../shared/atlas/list'
import { subpopulationStatus, workingEffectiveSize } from '../../../shared/atlas/working-effective-size'
import { syntheticRecords } from './synthetic-records'

const all: AtlasListQuery = { search: '', statuses: [], sort: 'name', direction: 'asc' }

function record(id: number, name: string, ne: number | null, census: number | null, environmentClass: string | null = null) {
  const effectiveSize = workingEffectiveSize({ workingNe: ne, workingNeReason: ne === null ? null : 'r', latestEstimate: null, latestCensus: census === null ? null : { year: 2024, adults: census } })
  return { id, name, environmentClass, latestCensus: census === null ? null : { adults: census }, effectiveSize, status: subpopulationStatus(effectiveSize) }
}

const small = [
  record(1, 'Owlfeather Bald', 6, 20, 'grassy bald'),
  record(2, 'Ashfern Hollow', 379, 395, 'cove forest'),
  record(3, 'Émile Seep', null, null, 'seepage slope'),
  record(4, 'Lanternmoss Gap', 1147, 3738, 'northern hardwood'),
  record(5, 'Brackenveil Knob', 31, 153, 'cove forest'),
  record(6, 'ashfern hollow', 60, 700, null),
]

describe('filterAndSortRecords', () => {
  it('sorts by name without regard to case, ties by id', () => {
    expect(filterAndSortRecords(small, all).map(r => r.id)).toEqual([2, 6, 5, 3, 4, 1])
    expect(filterAndSortRecords(small, { ...all, direction: 'desc' }).map(r => r.id)).toEqual([1, 4, 3, 5, 6, 2])
  })

  it('sorts by projected F, working Ne and census, records without the figure last either way', () => {
    expect(filterAndSortRecords(small, { ...all, sort: 'projectedInbreeding', direction: 'desc' }).map(r => r.id)).toEqual([1, 5, 6, 2, 4, 3])
    expect(filterAndSortRecords(small, { ...all, sort: 'projectedInbreeding', direction: 'asc' }).map(r => r.id)).toEqual([4, 2, 6, 5, 1, 3])
    expect(filterAndSortRecords(small, { ...all, sort: 'effectiveSize', direction: 'asc' }).map(r => r.id)).toEqual([1, 5, 6, 2, 4, 3])
    expect(filterAndSortRecords(small, { ...all, sort: 'census', direction: 'desc' }).map(r => r.id)).toEqual([4, 6, 2, 5, 1, 3])
  })

  it('filters by status (empty = all) and searches name and environment, ignoring case and accents', () => {
    expect(filterAndSortRecords(small, { ...all, statuses: ['critical'] }).map(r => r.id)).toEqual([5, 1])
    expect(filterAndSortRecords(small, { ...all, statuses: ['unknown', 'connected'] }).map(r => r.id)).toEqual([3, 4])
    expect(filterAndSortRecords(small, { ...all, search: 'COVE' }).map(r => r.id)).toEqual([2, 5])
    expect(filterAndSortRecords(small, { ...all, search: 'emile' }).map(r => r.id)).toEqual([3])
    expect(filterAndSortRecords(small, { ...all, search: '  hollow   ash ' }).map(r => r.id)).toEqual([2, 6])
    expect(filterAndSortRecords(small, { ...all, search: 'nothing like it' })).toEqual([])
  })

  it('counts records by status for the filter chips', () => {
    expect(countByStatus(small)).toEqual({ critical: 2, declining: 1, watch: 1, stable: 0, connected: 1, unknown: 1 })
    expect(foldText('Émile ÅSH')).toBe('emile ash')
  })
})

describe('1,000 records', () => {
  const records = syntheticRecords(1000, 7)

  it('status computation is pure: the same inputs give the same status, every level occurs', () => {
    const again = records.map(r => subpopulationStatus(workingEffectiveSize({ workingNe: r.workingNe, workingNeReason: r.workingNeReason, latestEstimate: r.latestEstimate, latestCensus: r.latestCensus })))
    expect(again).toEqual(records.map(r => r.status))
    const counts = countByStatus(records)
    for (const key of ['critical', 'declining', 'watch', 'stable', 'connected', 'unknown'] as const) expect(counts[key], key).toBeGreaterThan(0)
    expect(Object.values(counts).reduce((a, b) => a + b, 0)).toBe(1000)
  })

  it('filtering and sorting do not change the input and give the same answer twice', () => {
    const snapshot = JSON.stringify(records)
    const query: AtlasListQuery = { search: 'fern', statuses: ['critical', 'declining'], sort: 'projectedInbreeding', direction: 'desc' }
    const first = filterAndSortRecords(records, query)
    const second = filterAndSortRecords(records, query)
    expect(JSON.stringify(records)).toBe(snapshot)
    expect(second.map(r => r.id)).toEqual(first.map(r => r.id))
    expect(first.length).toBeGreaterThan(0)
    for (const r of first) {
      expect(['critical', 'declining']).toContain(r.status.key)
      expect(foldText(`${r.name} ${r.environmentClass}`)).toContain('fern')
    }
    const projected = first.map(r => r.status.projectedInbreeding ?? -1)
    expect([...projected].sort((a, b) => b - a)).toEqual(projected)
  })
})
