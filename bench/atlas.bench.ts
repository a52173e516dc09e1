/**
 * The Atlas at 1,000 subpopulations: status computation, list filtering and sorting, the
 * import readers, and the distance table (full matrix up to its limit, nearest neighbours
 * beyond). Prints milliseconds per operation. `npx tsx bench/run.ts atlas`.
 */
import { performance } from 'node:perf_hooks'
import { distanceTable } from '../shared/atlas/distances'
import { subpopulationsToCsv, subpopulationsToGeoJson } from '../shared/atlas/export'
import { readCsvImport } from '../shared/atlas/import-csv'
import { readGeoJsonImport } from '../shared/atlas/import-geojson'
import { filterAndSortRecords, type AtlasListQuery } from '../shared/atlas/list'
import { subpopulationStatus, workingEffectiveSize } from '../shared/atlas/working-effective-size'
import { syntheticRecords } from '../tests/unit/atlas/synthetic-records'

/** Median milliseconds of `runs` runs of `body` (after one warm-up run). */
function median(label: string, runs: number, body: () => unknown): number {
  body()
  const times: number[] = []
  for (let run = 0; run < runs; run += 1) {
    const start = performance.now()
    body()
    times.push(performance.now() - start)
  }
  times.sort((a, b) => a - b)
  const middle = times[Math.floor(times.length / 2)] ?? Number.NaN
  console.log(`${label.padEnd(62)} ${middle.toFixed(2).padStart(9)} ms`)
  return middle
}

export default async function (): Promise<void> {
  const records = syntheticRecords(1000, 11)
  console.log('1,000 invented subpopulations (tests/unit/atlas/synthetic-records.ts)')

  const status = median('status of 1,000 (working Ne → F₁₀, level, band)', 21, () => records.map(r =>
    subpopulationStatus(workingEffectiveSize({ workingNe: r.workingNe, workingNeReason: r.workingNeReason, latestEstimate: r.latestEstimate, latestCensus: r.latestCensus }))))
  const queries: [string, AtlasListQuery][] = [
    ['list: no filter, by name', { search: '', statuses: [], sort: 'name', direction: 'asc' }],
    ['list: no filter, by projected F', { search: '', statuses: [], sort: 'projectedInbreeding', direction: 'desc' }],
    ['list: search "fern" + two statuses, by census', { search: 'fern', statuses: ['critical', 'declining'], sort: 'census', direction: 'desc' }],
  ]
  let slowest = 0
  for (const [label, query] of queries) slowest = Math.max(slowest, median(label, 21, () => filterAndSortRecords(records, query)))
  console.log(`  a keystroke in the search box costs ${slowest.toFixed(2)} ms (one 60 Hz frame is 16.7 ms: ${(16.7 / slowest).toFixed(0)}× headroom)`)
  console.log(`  status for all records vs one frame: ${(16.7 / status).toFixed(0)}× headroom`)

  const csv = subpopulationsToCsv(records)
  const geojson = JSON.stringify(subpopulationsToGeoJson(records))
  median(`read a CSV import of 1,000 rows (${(csv.length / 1024).toFixed(0)} KB)`, 5, () => readCsvImport(csv))
  median(`read a GeoJSON import of 1,000 features (${(geojson.length / 1024).toFixed(0)} KB)`, 5, () => readGeoJsonImport(geojson))

  for (const size of [100, 300]) {
    const subset = records.slice(0, size)
    median(`distance table, full matrix, ${size} subpopulations`, 3, () => distanceTable(subset))
  }
  median('distance table, 1,000 subpopulations (nearest neighbours only)', 3, () => distanceTable(records))
}
