/**
 * Census counts of a subpopulation (server/api/subpopulations/[id]/census/**): the row schema
 * shared by the add/edit form, the routes and the CSV import, the CSV template and the JSON
 * shapes the routes answer with.
 *
 * Rules (the same as the CHECK constraints of `census_counts`, migration 0001): one row per
 * subpopulation and year, 1800 ≤ year ≤ 2200; adults, males and females are whole numbers ≥ 0;
 * males ≤ adults, females ≤ adults and males + females ≤ adults (some adults may be unsexed).
 */
import { z } from 'zod'
import { VersionSchema } from './users'

/** Earliest and latest census year accepted (the database checks the same range). */
export const CENSUS_YEAR_RANGE = { min: 1800, max: 2200 } as const

/** Largest count accepted for one year (keeps figures inside PostgreSQL `integer`). */
export const MAX_CENSUS_COUNT = 100_000_000

const yearMessage = `Enter a year between ${CENSUS_YEAR_RANGE.min} and ${CENSUS_YEAR_RANGE.max}, like 2024.`

/** A census year: a whole number in CENSUS_YEAR_RANGE. */
export const CensusYearSchema = z.number({ error: yearMessage })
  .int(yearMessage)
  .min(CENSUS_YEAR_RANGE.min, yearMessage)
  .max(CENSUS_YEAR_RANGE.max, yearMessage)

function countSchema(what: string) {
  return z.number({ error: `${what} must be a whole number of animals, 0 or more.` })
    .int(`${what} must be a whole number of animals, 0 or more.`)
    .min(0, `${what} cannot be negative.`)
    .max(MAX_CENSUS_COUNT, `${what} must be at most ${MAX_CENSUS_COUNT.toLocaleString('en-GB')}.`)
}

function noteText(label: string, max: number) {
  return z.string({ error: `${label} must be text.` }).trim().max(max, `${label} has at most ${max} characters.`)
}

const censusFields = {
  year: CensusYearSchema,
  adults: countSchema('Adults'),
  /** null or absent: not recorded. */
  males: countSchema('Males').nullable().optional(),
  females: countSchema('Females').nullable().optional(),
  /** How the count was made (e.g. 'mark-recapture'). */
  method: noteText('The method', 200).optional(),
  /** Where the figure comes from (report, survey, person). */
  source: noteText('The source', 500).optional(),
}

/** The issues a row breaks against adults (males, females and their sum), at their field's path. */
export function censusSexIssues(row: { adults: number, males?: number | null, females?: number | null }): { path: 'males' | 'females', message: string }[] {
  const issues: { path: 'males' | 'females', message: string }[] = []
  const { adults, males, females } = row
  if (typeof males === 'number' && males > adults) issues.push({ path: 'males', message: `Males (${males}) cannot be more than adults (${adults}).` })
  if (typeof females === 'number' && females > adults) issues.push({ path: 'females', message: `Females (${females}) cannot be more than adults (${adults}).` })
  if (issues.length === 0 && typeof males === 'number' && typeof females === 'number' && males + females > adults) {
    issues.push({ path: 'females', message: `Males and females together (${males + females}) cannot be more than adults (${adults}).` })
  }
  return issues
}

/** One census row: POST /api/subpopulations/:id/census, one line of a CSV import, and the merged row of a PATCH. */
export const CensusRowSchema = z.object(censusFields).superRefine((row, context) => {
  for (const issue of censusSexIssues(row)) context.addIssue({ code: 'custom', path: [issue.path], message: issue.message })
})
export type CensusRowInput = z.infer<typeof CensusRowSchema>

/** PATCH /api/subpopulations/:id/census/:censusId: any fields, based on `version`. */
export const CensusPatchSchema = z.object({
  year: censusFields.year.optional(),
  adults: censusFields.adults.optional(),
  males: censusFields.males,
  females: censusFields.females,
  method: censusFields.method,
  source: censusFields.source,
  version: VersionSchema,
})
export type CensusPatchInput = z.infer<typeof CensusPatchSchema>

/** What to do with years that already have a census when importing. */
export const CENSUS_IMPORT_MODES = ['add', 'replace'] as const
export type CensusImportMode = typeof CENSUS_IMPORT_MODES[number]

/**
 * Largest CSV accepted by the import (bytes) and most data rows in one file (more than the 401
 * possible years, so a valid file always fits).
 */
export const CENSUS_IMPORT_MAX_BYTES = 256 * 1024
export const CENSUS_IMPORT_MAX_ROWS = 500

/** POST /api/subpopulations/:id/census/import as JSON (a text/csv body takes `mode` from the query). */
export const CensusImportSchema = z.object({
  csv: z.string({ error: 'Send the CSV text in "csv".' }).min(1, 'The CSV file is empty.'),
  mode: z.enum(CENSUS_IMPORT_MODES, { error: 'Choose add (refuse years already recorded) or replace (overwrite them).' }).default('add'),
})

/** Query of a text/csv import: ?mode=add|replace. */
export const CensusImportQuerySchema = z.object({
  mode: z.enum(CENSUS_IMPORT_MODES, { error: 'Choose add (refuse years already recorded) or replace (overwrite them).' }).default('add'),
})

/** The columns of the census CSV, in template order; year and adults are required. */
export const CENSUS_CSV_COLUMNS = [
  { name: 'year', required: true, description: `Census year, ${CENSUS_YEAR_RANGE.min}–${CENSUS_YEAR_RANGE.max}; one row per year.` },
  { name: 'adults', required: true, description: 'Adults counted (whole number, 0 or more).' },
  { name: 'males', required: false, description: 'Adult males, if sexed (blank if not recorded).' },
  { name: 'females', required: false, description: 'Adult females, if sexed (blank if not recorded). Males + females may not exceed adults.' },
  { name: 'method', required: false, description: 'How the count was made, e.g. mark-recapture, transect count.' },
  { name: 'source', required: false, description: 'Where the figure comes from: report, survey or person.' },
] as const

/**
 * The downloadable template: a header and two example rows (an invented subpopulation).
 * Comma-separated, UTF-8, one row per year; blank cells mean "not recorded".
 */
export const CENSUS_CSV_TEMPLATE = [
  CENSUS_CSV_COLUMNS.map(column => column.name).join(','),
  '2023,148,70,71,mark-recapture,Spring survey report 2023',
  '2024,153,,,transect count,"Field notes, K. Example"',
].join('\n') + '\n'

/**
 * A number typed into a form field, for a zod schema: '' → null (not recorded), a decimal
 * numeral → its number, anything else stays text so the schema reports "must be a number".
 *
 * @example numberFromField('12')   // 12
 * @example numberFromField(' ')    // null
 * @example numberFromField('12a')  // '12a'
 */
export function numberFromField(text: string | number | null | undefined): number | string | null {
  if (text === null || text === undefined) return null
  if (typeof text === 'number') return text
  const trimmed = text.trim()
  if (trimmed === '') return null
  return /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/.test(trimmed) ? Number(trimmed) : trimmed
}

/** One census row as the routes answer it. */
export interface CensusCountDto {
  id: number
  subpopulationId: number
  year: number
  adults: number
  males: number | null
  females: number | null
  method: string
  source: string
  updatedAt: string
  /** Send back with PATCH (optimistic locking). */
  version: number
}

/** GET /api/subpopulations/:id/census */
export interface CensusListResponse { items: CensusCountDto[] }

/** One problem of a CSV import: the spreadsheet row (header = row 1), the column and what is wrong. */
export interface CensusImportProblem {
  row: number
  column: string | null
  message: string
}

/** POST …/census/import → 201 */
export interface CensusImportResponse {
  created: number
  updated: number
  items: CensusCountDto[]
}
