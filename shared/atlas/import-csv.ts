/**
 * Reads a CSV import of points: a header row, then one subpopulation per row with `name`,
 * `latitude`, `longitude` (decimal degrees, WGS 84) and optionally `environment_class`,
 * `generation_time_years`, `years_isolated`, `notes` (camelCase and spaced spellings, and
 * lat/lon/lng, are accepted too). Row numbers are those a spreadsheet shows: the header is
 * row 1, the first subpopulation row 2. Every problem names its row. Nothing is stored here.
 */
import Papa from 'papaparse'
import {
  MAX_IMPORT_RECORDS, checkRecord, duplicateNameIssues, fieldFor, numberFrom, originIssue, sortIssues, textFrom,
  type FieldLabels, type ImportField, type ImportOptions, type ImportRecord,
} from './import-record'
import type { ImportReading } from './import-geojson'
import type { ImportIssue } from './types'

/** Columns every CSV import needs. */
export const REQUIRED_CSV_COLUMNS = ['name', 'latitude', 'longitude'] as const

function coordinateProblem(label: string, raw: string, value: number | null, limit: 90 | 180): string | null {
  if (value === null) return `${label} is empty; give decimal degrees between -${limit} and ${limit}.`
  if (Number.isNaN(value)) return `${label} must be a number of decimal degrees, got "${raw}".`
  if (value < -limit || value > limit) return `${label} must be between -${limit} and ${limit} degrees, got ${raw}.`
  return null
}

/**
 * Parses and checks a CSV import of points.
 *
 * @param text - the file's text (UTF-8; a byte-order mark is ignored)
 * @param options - default generation time for rows without one
 * @returns the valid records and the issues (each names its row); the import stores nothing
 *   unless `issues` is empty
 * @example readCsvImport('name,latitude,longitude\nA,95,-83').issues[0].message
 *   // 'Row 2 ("A"): latitude must be between -90 and 90 degrees, got 95.'
 */
export function readCsvImport(text: string, options: ImportOptions = {}): ImportReading {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { header: false, skipEmptyLines: false })
  const [header = [], ...rows] = parsed.data
  const columns = header.map((label): { label: string, field: ImportField | undefined } => ({ label: label.trim(), field: fieldFor(label) }))
  const missing = REQUIRED_CSV_COLUMNS.filter(required => !columns.some(column => column.field === required))
  if (missing.length) {
    const has = columns.map(column => column.label).filter(Boolean).join(', ') || 'no columns'
    return { records: [], issues: [{ path: '', message: `The CSV needs the columns name, latitude and longitude in its first row; missing: ${missing.join(', ')} (the first row has: ${has}).` }] }
  }
  const dataRows = rows.map((cells, index) => ({ cells, number: index + 2 }))
    .filter(row => row.cells.some(cell => cell.trim() !== ''))
  if (dataRows.length === 0) return { records: [], issues: [{ path: '', message: 'The CSV has a header but no rows to import.' }] }
  if (dataRows.length > MAX_IMPORT_RECORDS) {
    return { records: [], issues: [{ path: '', message: `The CSV has ${dataRows.length} rows; one import takes at most ${MAX_IMPORT_RECORDS}.` }] }
  }

  const issues: ImportIssue[] = []
  const records: ImportRecord[] = []
  for (const { cells, number } of dataRows) {
    const origin = { kind: 'row' as const, number }
    const values: Partial<Record<ImportField, string>> = {}
    // Columns the file lacks are named in messages as a CSV would name them.
    const labels: FieldLabels = { generationTimeYears: 'generation_time_years', yearsIsolated: 'years_isolated', environmentClass: 'environment_class' }
    columns.forEach((column, index) => {
      if (!column.field || values[column.field] !== undefined) return
      values[column.field] = cells[index] ?? ''
      labels[column.field] = column.label
    })
    const name = textFrom(values.name)
    if (cells.length > header.length && cells.slice(header.length).some(cell => cell.trim() !== '')) {
      issues.push(originIssue(origin, '', `has ${cells.length} values but the header has ${header.length} columns (a comma inside a value needs quotes).`, name))
      continue
    }
    const latitude = numberFrom(values.latitude)
    const longitude = numberFrom(values.longitude)
    const noLocation = latitude === null && longitude === null
    const latitudeProblem = noLocation
      ? `has no location: ${labels.latitude ?? 'latitude'} and ${labels.longitude ?? 'longitude'} are empty.`
      : coordinateProblem(labels.latitude ?? 'latitude', textFrom(values.latitude), latitude, 90)
    const longitudeProblem = noLocation ? null : coordinateProblem(labels.longitude ?? 'longitude', textFrom(values.longitude), longitude, 180)
    if (latitudeProblem) issues.push(originIssue(origin, 'latitude', latitudeProblem, name))
    if (longitudeProblem) issues.push(originIssue(origin, 'longitude', longitudeProblem, name))
    const point = latitudeProblem || longitudeProblem ? { type: 'Point', coordinates: [0, 0] } : { type: 'Point', coordinates: [longitude, latitude] }
    const fields = { name: values.name, environmentClass: values.environmentClass, generationTimeYears: values.generationTimeYears, yearsIsolated: values.yearsIsolated, notes: values.notes }
    const checked = checkRecord(origin, fields, labels, point, options)
    issues.push(...checked.issues)
    if (checked.record && !latitudeProblem && !longitudeProblem) records.push(checked.record)
  }
  const duplicates = duplicateNameIssues(records)
  const repeated = new Set(duplicates.map(issue => issue.row ?? issue.feature))
  return { records: records.filter(record => !repeated.has(record.origin.number)), issues: sortIssues([...issues, ...duplicates]) }
}
