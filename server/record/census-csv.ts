/**
 * Reads a census CSV (the template in shared/schemas/census.ts: year, adults, males, females,
 * method, source) into validated rows, or into a list of problems, each naming its spreadsheet
 * row (the header is row 1) and column. Nothing is half-read: a caller stores the rows only when
 * there is no problem at all.
 *
 * Accepted: a header row (any order, any case, surrounding spaces ignored), commas or the
 * delimiter the file uses (semicolon, tab), quoted cells, a UTF-8 byte-order mark, blank lines,
 * rows shorter than the header (missing trailing cells are blank). Refused, with a reason per
 * row: unknown or repeated columns, a missing year or adults column, extra cells, numbers that
 * are not plain whole numbers (no thousands separators), the row rules of CensusRowSchema and a
 * year repeated within the file.
 *
 * Pure (papaparse and zod only), unit-tested in tests/unit/subpopulation/census-csv.test.ts.
 */
import Papa from 'papaparse'
import {
  CENSUS_CSV_COLUMNS,
  CENSUS_IMPORT_MAX_ROWS,
  CensusRowSchema,
  type CensusImportProblem,
  type CensusRowInput,
} from '#shared/schemas/census'

/** A row ready to store, with its spreadsheet row number. */
export interface CensusCsvRow { row: number, data: CensusRowInput }

export interface ParsedCensusCsv {
  rows: CensusCsvRow[]
  problems: CensusImportProblem[]
}

type ColumnName = typeof CENSUS_CSV_COLUMNS[number]['name']
const COLUMN_NAMES: readonly string[] = CENSUS_CSV_COLUMNS.map(column => column.name)
const NUMBER_COLUMNS = new Set(['year', 'adults', 'males', 'females'])

/** Stops after this many problems: enough to fix a file, not a flood. */
export const MAX_REPORTED_PROBLEMS = 50

function isBlankRow(cells: readonly string[]): boolean {
  return cells.every(cell => cell.trim() === '')
}

/** '' → null, '12' → 12, anything else → the text (the schema then says "must be a number"). */
function cellValue(column: string, text: string): number | string | null {
  const trimmed = text.trim()
  if (!NUMBER_COLUMNS.has(column)) return trimmed
  if (trimmed === '') return null
  return /^[+-]?\d+(\.\d+)?$/.test(trimmed) ? Number(trimmed) : trimmed
}

function numberWords(column: string, text: string): string {
  if (/^\d{1,3}([,.' ]\d{3})+$/.test(text.trim())) return `${text.trim()} — write numbers with digits only, without thousands separators.`
  return `"${text.trim()}" is not a number.`
}

/**
 * Parses and checks a census CSV.
 *
 * @param text - the file's text (UTF-8)
 * @returns the rows (when `problems` is empty) and the problems
 * @example parseCensusCsv('year,adults\n2024,153\n').rows  // [{ row: 2, data: { year: 2024, adults: 153, … } }]
 * @example parseCensusCsv('year,adults\n2024,-3\n').problems  // [{ row: 2, column: 'adults', message: 'Adults cannot be negative.' }]
 */
export function parseCensusCsv(text: string): ParsedCensusCsv {
  const problems: CensusImportProblem[] = []
  const rows: CensusCsvRow[] = []
  const add = (problem: CensusImportProblem) => {
    if (problems.length < MAX_REPORTED_PROBLEMS) problems.push(problem)
  }

  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { header: false, skipEmptyLines: false })
  const records = parsed.data
  const headerIndex = records.findIndex(cells => !isBlankRow(cells))
  if (headerIndex < 0) {
    add({ row: 1, column: null, message: `The file is empty. Start with the header row: ${COLUMN_NAMES.join(',')}.` })
    return { rows, problems }
  }
  for (const error of parsed.errors) {
    if (error.code === 'UndetectableDelimiter') continue // a one-column file; reported as missing columns below
    add({ row: (error.row ?? 0) + 1, column: null, message: `The file cannot be read here: ${error.message}.` })
  }

  const header = (records[headerIndex] ?? []).map(cell => cell.trim().toLowerCase())
  const headerRow = headerIndex + 1
  const seen = new Set<string>()
  for (const name of header) {
    if (name === '') add({ row: headerRow, column: null, message: 'A column has no name in the header row.' })
    else if (!COLUMN_NAMES.includes(name)) add({ row: headerRow, column: name, message: `Unknown column "${name}". The columns are: ${COLUMN_NAMES.join(', ')}.` })
    else if (seen.has(name)) add({ row: headerRow, column: name, message: `The column "${name}" appears twice.` })
    seen.add(name)
  }
  for (const column of CENSUS_CSV_COLUMNS) {
    if (column.required && !seen.has(column.name)) add({ row: headerRow, column: column.name, message: `The header row has no "${column.name}" column (required).` })
  }
  if (problems.length > 0) return { rows, problems }

  const dataRows = records.slice(headerIndex + 1).filter(cells => !isBlankRow(cells)).length
  if (dataRows > CENSUS_IMPORT_MAX_ROWS) {
    add({ row: headerRow + 1, column: null, message: `The file has ${dataRows} census rows; at most ${CENSUS_IMPORT_MAX_ROWS} are read in one import. Split it into smaller files.` })
    return { rows, problems }
  }
  const firstRowOfYear = new Map<number, number>()
  for (let index = headerIndex + 1; index < records.length; index++) {
    const cells = records[index] ?? []
    if (isBlankRow(cells)) continue
    const rowNumber = index + 1
    if (cells.length > header.length && !isBlankRow(cells.slice(header.length))) {
      add({ row: rowNumber, column: null, message: `Row ${rowNumber} has ${cells.length} cells but the header has ${header.length}. Put text that contains the delimiter in double quotes.` })
      continue
    }
    const record: Partial<Record<ColumnName, number | string | null>> = {}
    const notNumbers: { column: string, text: string }[] = []
    header.forEach((column, position) => {
      const value = cellValue(column, cells[position] ?? '')
      if (NUMBER_COLUMNS.has(column) && typeof value === 'string') notNumbers.push({ column, text: value })
      record[column as ColumnName] = value
    })
    for (const { column, text } of notNumbers) add({ row: rowNumber, column, message: `Row ${rowNumber}, ${column}: ${numberWords(column, text)}` })
    if (notNumbers.length > 0) continue

    const checked = CensusRowSchema.safeParse({
      ...record,
      year: record.year ?? undefined,
      adults: record.adults ?? undefined,
    })
    if (!checked.success) {
      for (const issue of checked.error.issues) {
        const column = typeof issue.path[0] === 'string' ? issue.path[0] : null
        add({ row: rowNumber, column, message: `Row ${rowNumber}${column ? `, ${column}` : ''}: ${issue.message}` })
      }
      continue
    }
    const earlier = firstRowOfYear.get(checked.data.year)
    if (earlier !== undefined) {
      add({ row: rowNumber, column: 'year', message: `Row ${rowNumber}, year: ${checked.data.year} appears twice (also row ${earlier}); keep one row per year.` })
      continue
    }
    firstRowOfYear.set(checked.data.year, rowNumber)
    rows.push({ row: rowNumber, data: checked.data })
  }
  if (dataRows === 0 && problems.length === 0) add({ row: headerRow + 1, column: null, message: 'The file has a header row but no census rows.' })
  return { rows: problems.length > 0 ? [] : rows, problems }
}
