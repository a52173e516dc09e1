import { detectDelimiter, splitDelimitedLine } from './csv-fields'
import { ParseErrorList, splitLines } from './parse-errors'
import type { Genotype, GenotypedIndividual, GenotypeParseResult } from './types'

/** Options of `parseGenotypeCsv`. */
export interface GenotypeCsvOptions {
  /** cell values meaning "allele not scored", compared after trimming (default ['0', 'NA', '']) */
  missing?: readonly string[]
  /** field separator; default: whichever of , ; or tab occurs most in the header line */
  delimiter?: ',' | ';' | '\t'
}

interface CsvHeader {
  width: number
  loci: string[]
}

const ALLELE_ONE = /^(.+)_1$/
const ALLELE_TWO = /^(.+)_2$/

function trimmedFields(line: string, delimiter: string): { fields: string[] } | { error: string } {
  const split = splitDelimitedLine(line, delimiter)
  if ('error' in split) return split
  return { fields: split.fields.map(field => field.trim()) }
}

/** Drops empty cells past `width` (spreadsheets pad rows with trailing separators). */
function withoutTrailingPadding(fields: string[], width: number): string[] {
  let end = fields.length
  while (end > width && fields[end - 1] === '') end -= 1
  return fields.slice(0, end)
}

function readHeader(line: string, lineNumber: number, delimiter: string, errors: ParseErrorList): CsvHeader | null {
  const split = trimmedFields(line, delimiter)
  if ('error' in split) {
    errors.add(lineNumber, `header: ${split.error}`)
    return null
  }
  const cells = withoutTrailingPadding(split.fields, 1)
  const before = errors.errors.length
  if (cells.length < 3 || (cells.length - 1) % 2 !== 0) {
    errors.add(lineNumber, `the header needs an id column then two columns per locus, like "id,Loc1_1,Loc1_2"; it has ${cells.length} columns`)
    return null
  }
  if (ALLELE_ONE.test(cells[0] ?? '')) errors.add(lineNumber, `the first column must hold the individual ids, but its header is "${cells[0]}"`)
  const loci: string[] = []
  for (let column = 1; column + 1 < cells.length; column += 2) {
    const first = cells[column] ?? ''
    const second = cells[column + 1] ?? ''
    const locus = ALLELE_ONE.exec(first)?.[1]
    if (locus === undefined) {
      errors.add(lineNumber, `column ${column + 1} header is "${first}"; expected "<locus>_1" (each locus takes two columns, <locus>_1 then <locus>_2)`)
      continue
    }
    if (ALLELE_TWO.exec(second)?.[1] !== locus) {
      errors.add(lineNumber, `column ${column + 2} header is "${second}"; expected "${locus}_2" right after "${first}"`)
      continue
    }
    if (loci.includes(locus)) errors.add(lineNumber, `locus "${locus}" has more than one pair of columns`)
    loci.push(locus)
  }
  return errors.errors.length === before ? { width: cells.length, loci } : null
}

function readGenotype(first: string, second: string, missing: ReadonlySet<string>, locus: string, lineNumber: number, errors: ParseErrorList): Genotype | null {
  const firstMissing = missing.has(first)
  const secondMissing = missing.has(second)
  if (firstMissing && secondMissing) return null
  if (firstMissing || secondMissing) {
    errors.add(lineNumber, `locus "${locus}": one allele is missing ("${first}" and "${second}"); give both alleles or mark both as missing`)
    return null
  }
  if (first === '' || second === '') {
    errors.add(lineNumber, `locus "${locus}": empty cell; write both alleles or a missing-data code such as 0`)
    return null
  }
  return [first, second]
}

/**
 * Reads a genotype table written as delimited text into a `GenotypeDataset`.
 * Pure string → data (no I/O), used by the browser preview and the server.
 *
 * Format (one population per file):
 *   id,Loc1_1,Loc1_2,Loc2_1,Loc2_2
 *   AH1,101,103,200,200
 *   AH2,101,101,0,0
 * - Line 1 (the first non-blank line) is the header: an id column (any
 *   name), then two columns per locus named `<locus>_1` and `<locus>_2`,
 *   adjacent and in that order. Locus names must be unique.
 * - Each following line is one individual: a unique, non-empty id, then its
 *   two alleles at each locus, in header order. Alleles are text labels
 *   (e.g. fragment sizes "101" or bases "A"), kept as written after trimming
 *   spaces.
 * - Missing data: a cell whose trimmed value is in `options.missing`
 *   (default "0", "NA" and empty). Both alleles of a locus must be missing
 *   together; a half-missing genotype is an error.
 * - Separator: comma by default; semicolon or tab are detected from the
 *   header. Fields may be double-quoted ("" inside quotes is a quote); a
 *   quoted field cannot span lines. Blank lines (or lines of separators
 *   only) are skipped; trailing empty cells beyond the header are ignored.
 *   LF, CRLF and CR line ends and a UTF-8 byte-order mark are accepted.
 * Errors carry the 1-based line number of the offending line; all errors
 * are reported (up to `MAX_PARSE_ERRORS`), not only the first.
 *
 * @param text - the whole file as a string
 * @param options.missing - missing-data codes (default ['0', 'NA', ''])
 * @param options.delimiter - force ',', ';' or '\t'
 * @returns `{ dataset }` or `{ errors: [{ line, message }] }`
 * @example parseGenotypeCsv('id,Loc1_1,Loc1_2\nAH1,101,103\nAH2,0,0\n')
 *   // { dataset: { loci: ['Loc1'], individuals: [
 *   //   { id: 'AH1', genotypes: [['101', '103']] }, { id: 'AH2', genotypes: [null] }] } }
 * @example parseGenotypeCsv('id,Loc1_1,Loc1_2\nAH1,101\n')
 *   // { errors: [{ line: 2, message: 'has 2 columns; the header has 3' }] }
 * @example parseGenotypeCsv('id,Loc1_1,Loc1_2\nAH1,101,0\n')
 *   // { errors: [{ line: 2, message: 'locus "Loc1": one allele is missing ("101" and "0"); give both alleles or mark both as missing' }] }
 */
export function parseGenotypeCsv(text: string, options: GenotypeCsvOptions = {}): GenotypeParseResult {
  const errors = new ParseErrorList()
  const missing = new Set(options.missing ?? ['0', 'NA', ''])
  const lines = splitLines(text)
  const headerIndex = lines.findIndex(line => line.trim() !== '')
  if (headerIndex < 0) return { errors: [{ line: 1, message: 'the file is empty' }] }
  const headerLine = lines[headerIndex] ?? ''
  const delimiter = options.delimiter ?? detectDelimiter(headerLine)
  const header = readHeader(headerLine, headerIndex + 1, delimiter, errors)
  if (!header) return { errors: errors.errors }

  const individuals: GenotypedIndividual[] = []
  const idLines = new Map<string, number>()
  for (let index = headerIndex + 1; index < lines.length && !errors.full; index++) {
    const lineNumber = index + 1
    const split = trimmedFields(lines[index] ?? '', delimiter)
    if ('error' in split) {
      errors.add(lineNumber, split.error)
      continue
    }
    if (split.fields.every(field => field === '')) continue
    const fields = withoutTrailingPadding(split.fields, header.width)
    if (fields.length !== header.width) {
      errors.add(lineNumber, `has ${fields.length} columns; the header has ${header.width}`)
      continue
    }
    const id = fields[0] ?? ''
    if (id === '') errors.add(lineNumber, 'the id column is empty')
    else if (idLines.has(id)) errors.add(lineNumber, `id "${id}" is already used on line ${idLines.get(id)}`)
    else idLines.set(id, lineNumber)
    const genotypes = header.loci.map((locus, locusIndex) =>
      readGenotype(fields[1 + 2 * locusIndex] ?? '', fields[2 + 2 * locusIndex] ?? '', missing, locus, lineNumber, errors))
    individuals.push({ id, genotypes })
  }
  if (!errors.empty) return { errors: errors.errors }
  if (individuals.length === 0) return { errors: [{ line: headerIndex + 1, message: 'no individuals: the header is not followed by any data line' }] }
  return { dataset: { loci: header.loci, individuals } }
}
