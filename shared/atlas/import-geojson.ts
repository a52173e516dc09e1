/**
 * Reads a GeoJSON import: a FeatureCollection (or one Feature) whose features carry a
 * Polygon, MultiPolygon or Point and, in `properties`, a `name` and optionally
 * `environmentClass`, `generationTimeYears`, `yearsIsolated`, `notes` (snake_case and spaced
 * spellings are accepted too). Every problem names its feature: "Feature 3 ("Ashfern
 * Hollow"): The boundary crosses itself near …". Nothing is stored here.
 */
import { getIssues } from '@placemarkio/check-geojson'
import {
  MAX_IMPORT_RECORDS, checkRecord, duplicateNameIssues, fieldFor, originIssue, sortIssues,
  type FieldLabels, type ImportAttribute, type ImportOptions, type ImportRecord,
} from './import-record'
import type { ImportIssue } from './types'

/**
 * What a file read gives: the records that passed every check, and the problems of the others
 * (plus whole-file problems). An import goes ahead only when `issues` is empty; the valid
 * records are kept so further checks (names already taken) can be reported in the same answer.
 */
export interface ImportReading {
  records: ImportRecord[]
  issues: ImportIssue[]
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value)
}

function fileIssue(message: string): ImportIssue {
  return { path: '', message }
}

/**
 * Parses and checks a GeoJSON import.
 *
 * @param text - the file's text
 * @param options - default generation time for features without one
 * @returns the valid records and the issues (each names its feature); the import stores
 *   nothing unless `issues` is empty
 * @example readGeoJsonImport('{"type":"FeatureCollection","features":[]}').issues[0].message
 *   // 'The file has no features to import.'
 */
export function readGeoJsonImport(text: string, options: ImportOptions = {}): ImportReading {
  let parsed: unknown
  try {
    parsed = JSON.parse(text)
  } catch {
    const detail = getIssues(text)[0]?.message ?? 'Invalid JSON.'
    return { records: [], issues: [fileIssue(`The file is not valid JSON: ${detail.replace(/^Invalid JSON: /, '')}`)] }
  }
  if (!isRecord(parsed) || (parsed.type !== 'FeatureCollection' && parsed.type !== 'Feature')) {
    const found = isRecord(parsed) && typeof parsed.type === 'string' ? `a ${parsed.type}` : 'something else'
    return { records: [], issues: [fileIssue(`The file must be a GeoJSON FeatureCollection (or one Feature); it is ${found}.`)] }
  }
  const features: unknown[] = parsed.type === 'Feature' ? [parsed] : Array.isArray(parsed.features) ? parsed.features : []
  if (parsed.type === 'FeatureCollection' && !Array.isArray(parsed.features)) {
    return { records: [], issues: [fileIssue('The FeatureCollection has no "features" list.')] }
  }
  if (features.length === 0) return { records: [], issues: [fileIssue('The file has no features to import.')] }
  if (features.length > MAX_IMPORT_RECORDS) {
    return { records: [], issues: [fileIssue(`The file has ${features.length} features; one import takes at most ${MAX_IMPORT_RECORDS}.`)] }
  }

  const records: ImportRecord[] = []
  const issues: ImportIssue[] = []
  features.forEach((feature, index) => {
    const origin = { kind: 'feature' as const, number: index + 1 }
    if (!isRecord(feature) || feature.type !== 'Feature') {
      issues.push(originIssue(origin, '', 'is not a GeoJSON Feature (it needs "type": "Feature", a geometry and properties).'))
      return
    }
    const properties = isRecord(feature.properties) ? feature.properties : {}
    const fields: Partial<Record<'name' | ImportAttribute, unknown>> = {}
    const labels: FieldLabels = {}
    for (const [key, value] of Object.entries(properties)) {
      const field = fieldFor(key)
      if (!field || field === 'latitude' || field === 'longitude' || field in fields) continue
      fields[field] = value
      labels[field] = key
    }
    if (feature.geometry === null || feature.geometry === undefined) {
      issues.push(originIssue(origin, 'geometry', 'has no geometry; each feature needs a Polygon, MultiPolygon or Point.', typeof fields.name === 'string' ? fields.name : undefined))
      return
    }
    const checked = checkRecord(origin, fields, labels, feature.geometry, options)
    issues.push(...checked.issues)
    if (checked.record) records.push(checked.record)
  })
  const duplicates = duplicateNameIssues(records)
  const repeated = new Set(duplicates.map(issue => issue.row ?? issue.feature))
  return { records: records.filter(record => !repeated.has(record.origin.number)), issues: sortIssues([...issues, ...duplicates]) }
}
