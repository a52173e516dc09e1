/**
 * The part of an import shared by GeoJSON features and CSV rows: reading the attributes from
 * loosely named fields ("environment_class", "Environment class", "environmentClass" …),
 * checking them with the attributes schema and the boundary checks, and phrasing every
 * problem so it names its feature or row.
 */
import { SubpopulationAttributesSchema, type SubpopulationAttributes } from '../schemas/subpopulation'
import { boundaryProblems } from './geometry-check'
import type { ImportIssue, SubpopulationGeometry } from './types'

/** Most features or rows one import may hold. */
export const MAX_IMPORT_RECORDS = 5000

/** Where a record came from: a 1-based feature number, or a spreadsheet row (header = row 1). */
export type RecordOrigin = { kind: 'feature', number: number } | { kind: 'row', number: number }

/** Attribute fields an import may set (besides the boundary). */
export type ImportAttribute = 'environmentClass' | 'generationTimeYears' | 'yearsIsolated' | 'notes'

/** One subpopulation read from a file, checked and ready to store. */
export interface ImportRecord {
  origin: RecordOrigin
  name: string
  geometry: SubpopulationGeometry
  /** The checked attributes; generation time is null only when updates may leave it out. */
  attributes: Omit<SubpopulationAttributes, 'generationTimeYears'> & { generationTimeYears: number | null }
  /** Attributes the file actually gave (an update changes only these). */
  given: ImportAttribute[]
  /** The file's own name for the generation-time field (for messages). */
  generationTimeLabel: string
}

/** Settings of an import. */
export interface ImportOptions {
  /** Generation time (years) for records that do not give one. */
  defaultGenerationTimeYears?: number | null
  /**
   * False when records may update existing subpopulations, which keep their generation time:
   * then a missing one is left null here and the importer asks for it for new records only.
   */
  requireGenerationTime?: boolean
}

/** The sentence for a record without a generation time. */
export function missingGenerationTimeMessage(label: string): string {
  return `${label} is missing; give it in the file or set a default generation time for the import.`
}

/** Every field an import reads. */
export type ImportField = 'name' | ImportAttribute | 'latitude' | 'longitude'

/** Field names people use, squashed (lower case, letters and digits only) → our field. */
const FIELD_ALIASES: Record<string, ImportField> = {
  name: 'name',
  subpopulation: 'name',
  subpopulationname: 'name',
  environmentclass: 'environmentClass',
  environment: 'environmentClass',
  habitat: 'environmentClass',
  generationtimeyears: 'generationTimeYears',
  generationtime: 'generationTimeYears',
  generationlength: 'generationTimeYears',
  yearsisolated: 'yearsIsolated',
  isolatedyears: 'yearsIsolated',
  notes: 'notes',
  note: 'notes',
  latitude: 'latitude',
  lat: 'latitude',
  longitude: 'longitude',
  lon: 'longitude',
  lng: 'longitude',
  long: 'longitude',
}

/** The file's label of each field, for messages ("generation_time_years"). */
export type FieldLabels = Partial<Record<ImportField, string>>

/**
 * Our field for a column or property name, or undefined when we do not use it.
 *
 * @example fieldFor('Environment class') // 'environmentClass'
 * @example fieldFor('LAT')               // 'latitude'
 * @example fieldFor('colour')            // undefined
 */
export function fieldFor(label: string): ImportField | undefined {
  return FIELD_ALIASES[label.toLowerCase().replace(/[^a-z0-9]/g, '')]
}

/** "Feature 3" / "Row 5", with the name when known: 'Feature 3 ("Ashfern Hollow")'. */
export function originLabel(origin: RecordOrigin, name?: string): string {
  const base = origin.kind === 'feature' ? `Feature ${origin.number}` : `Row ${origin.number}`
  return name ? `${base} ("${name}")` : base
}

/** An issue tied to a feature ('features.<index>.<field>') or row ('rows.<row number>.<field>'). */
export function originIssue(origin: RecordOrigin, field: string, message: string, name?: string): ImportIssue {
  const index = origin.number - (origin.kind === 'feature' ? 1 : 2)
  const path = origin.kind === 'feature'
    ? `features.${index}${field ? `.${field}` : ''}`
    : `rows.${origin.number}${field ? `.${field}` : ''}`
  const issue: ImportIssue = { path, message: `${originLabel(origin, name)}: ${message}` }
  if (origin.kind === 'feature') issue.feature = origin.number
  else issue.row = origin.number
  return issue
}

/** A value of a cell or property as a number: '' / null / undefined → null; junk → NaN. */
export function numberFrom(value: unknown): number | null {
  if (value === null || value === undefined) return null
  if (typeof value === 'number') return value
  if (typeof value !== 'string') return Number.NaN
  const text = value.trim()
  if (text === '') return null
  return /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(text) ? Number(text) : Number.NaN
}

/** A value as text: null / undefined → ''; numbers as written. */
export function textFrom(value: unknown): string {
  if (value === null || value === undefined) return ''
  if (typeof value === 'string') return value.trim()
  if (typeof value === 'number' || typeof value === 'boolean') return String(value)
  return JSON.stringify(value)
}

const UNITS: Record<ImportAttribute, string> = {
  environmentClass: '',
  generationTimeYears: ' (years)',
  yearsIsolated: ' (years)',
  notes: '',
}

/**
 * Checks one record's name, attributes and boundary; returns the record or its problems.
 *
 * @param origin - feature or row it came from
 * @param fields - our field → raw value (from properties or cells)
 * @param labels - our field → the file's own name for it (for messages)
 * @param geometry - the boundary (a Point for CSV rows)
 * @param options - import settings (default generation time)
 */
export function checkRecord(
  origin: RecordOrigin,
  fields: Partial<Record<'name' | ImportAttribute, unknown>>,
  labels: FieldLabels,
  geometry: unknown,
  options: ImportOptions,
): { record: ImportRecord | null, issues: ImportIssue[] } {
  const issues: ImportIssue[] = []
  const name = textFrom(fields.name)
  const label = (field: keyof FieldLabels) => labels[field] ?? field

  const given: ImportAttribute[] = []
  const numeric: Partial<Record<'generationTimeYears' | 'yearsIsolated', number | null>> = {}
  for (const field of ['generationTimeYears', 'yearsIsolated'] as const) {
    const value = numberFrom(fields[field])
    if (value !== null && Number.isNaN(value)) {
      issues.push(originIssue(origin, field, `${label(field)} must be a number${UNITS[field]}, got "${textFrom(fields[field])}".`, name))
    } else {
      numeric[field] = value
      if (value !== null) given.push(field)
    }
  }
  const environmentClass = textFrom(fields.environmentClass)
  if (environmentClass !== '') given.push('environmentClass')
  const notes = textFrom(fields.notes)
  if (notes !== '') given.push('notes')

  const generationTimeYears = numeric.generationTimeYears ?? options.defaultGenerationTimeYears ?? null
  const badGenerationTime = issues.some(issue => issue.path.endsWith('generationTimeYears'))
  if (generationTimeYears === null && !badGenerationTime && options.requireGenerationTime !== false) {
    issues.push(originIssue(origin, 'generationTimeYears', missingGenerationTimeMessage(label('generationTimeYears')), name))
  }

  const attributes = SubpopulationAttributesSchema.safeParse({
    name,
    environmentClass: environmentClass === '' ? null : environmentClass,
    generationTimeYears: generationTimeYears ?? 1,
    yearsIsolated: numeric.yearsIsolated ?? null,
    notes,
  })
  if (!attributes.success) {
    for (const problem of attributes.error.issues) {
      const field = String(problem.path[0] ?? '')
      if (field === 'generationTimeYears' && generationTimeYears === null) continue
      issues.push(originIssue(origin, field, problem.message, name))
    }
  }

  for (const message of boundaryProblems(geometry)) issues.push(originIssue(origin, 'geometry', message, name))

  if (issues.length || !attributes.success) return { record: null, issues }
  return {
    record: { origin, name: attributes.data.name, geometry: geometry as SubpopulationGeometry, attributes: { ...attributes.data, generationTimeYears }, given, generationTimeLabel: label('generationTimeYears') },
    issues,
  }
}

/**
 * Adds an issue for every record whose name repeats an earlier one in the same file
 * (names are unique within a species, compared without case).
 */
export function duplicateNameIssues(records: readonly ImportRecord[]): ImportIssue[] {
  const seen = new Map<string, RecordOrigin>()
  const issues: ImportIssue[] = []
  for (const record of records) {
    const key = record.name.toLowerCase()
    const first = seen.get(key)
    if (first) issues.push(originIssue(record.origin, 'name', `the name is already used by ${originLabel(first).toLowerCase()} of this file.`, record.name))
    else seen.set(key, record.origin)
  }
  return issues
}

/** Issues in file order: whole-file first, then by feature or row number (stable). */
export function sortIssues(issues: readonly ImportIssue[]): ImportIssue[] {
  const position = (issue: ImportIssue) => issue.feature ?? issue.row ?? 0
  return [...issues].sort((a, b) => position(a) - position(b))
}
