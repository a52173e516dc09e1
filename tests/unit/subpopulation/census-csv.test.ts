/**
 * The census row schema (shared/schemas/census.ts) and the CSV reader of the import
 * (server/record/census-csv.ts): row rules with their messages and paths, the downloadable
 * template, row numbers (header = row 1) in every problem, and a round trip of random valid
 * series (property test). Expected values are the rules themselves (common practice, no source).
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  CENSUS_CSV_COLUMNS,
  CENSUS_CSV_TEMPLATE,
  CENSUS_IMPORT_MAX_ROWS,
  CensusPatchSchema,
  CensusRowSchema,
  censusSexIssues,
  numberFromField,
} from '../../../shared/schemas/census'
import { MAX_REPORTED_PROBLEMS, parseCensusCsv } from '../../../server/record/census-csv'

describe('CensusRowSchema', () => {
  it('accepts counts ≥ 0 with males + females ≤ adults, sexes optional', () => {
    expect(CensusRowSchema.parse({ year: 2024, adults: 153 })).toEqual({ year: 2024, adults: 153 })
    expect(CensusRowSchema.parse({ year: 2024, adults: 10, males: 4, females: 6, method: ' count ', source: '' }))
      .toEqual({ year: 2024, adults: 10, males: 4, females: 6, method: 'count', source: '' })
    expect(CensusRowSchema.parse({ year: 1800, adults: 0, males: null, females: 0 }).males).toBeNull()
  })

  it('puts each broken rule at its field', () => {
    const issues = (input: unknown) => {
      const result = CensusRowSchema.safeParse(input)
      return result.success ? [] : result.error.issues.map(issue => ({ path: issue.path.join('.'), message: issue.message }))
    }
    expect(issues({ year: 2024, adults: -1 })).toEqual([{ path: 'adults', message: 'Adults cannot be negative.' }])
    expect(issues({ year: 2024, adults: 1.5 })).toEqual([{ path: 'adults', message: 'Adults must be a whole number of animals, 0 or more.' }])
    expect(issues({ year: 1799, adults: 1 })).toEqual([{ path: 'year', message: 'Enter a year between 1800 and 2200, like 2024.' }])
    expect(issues({ year: 2024, adults: 10, males: 6, females: 5 })).toEqual([{ path: 'females', message: 'Males and females together (11) cannot be more than adults (10).' }])
    expect(issues({ year: 2024, adults: 10, males: 11, females: 12 })).toEqual([
      { path: 'males', message: 'Males (11) cannot be more than adults (10).' },
      { path: 'females', message: 'Females (12) cannot be more than adults (10).' },
    ])
    expect(issues({ adults: 3 }).map(issue => issue.path)).toEqual(['year'])
  })

  it('censusSexIssues: equality is allowed, one sex alone is checked against adults', () => {
    expect(censusSexIssues({ adults: 10, males: 5, females: 5 })).toEqual([])
    expect(censusSexIssues({ adults: 10, males: 11 })).toHaveLength(1)
    expect(censusSexIssues({ adults: 10, females: null })).toEqual([])
  })

  it('CensusPatchSchema needs the version and allows clearing a count', () => {
    expect(CensusPatchSchema.safeParse({ adults: 3 }).success).toBe(false)
    expect(CensusPatchSchema.parse({ males: null, version: 2 })).toEqual({ males: null, version: 2 })
  })

  it('numberFromField: empty → null, numerals → numbers, the rest stays text', () => {
    expect(numberFromField('')).toBeNull()
    expect(numberFromField('  ')).toBeNull()
    expect(numberFromField(' 42 ')).toBe(42)
    expect(numberFromField('0.25')).toBe(0.25)
    expect(numberFromField('1e3')).toBe(1000)
    expect(numberFromField('12a')).toBe('12a')
    expect(numberFromField('1,200')).toBe('1,200')
    expect(numberFromField(7)).toBe(7)
  })
})

describe('parseCensusCsv', () => {
  it('reads the downloadable template: the documented columns, two valid rows', () => {
    expect(CENSUS_CSV_TEMPLATE.split('\n')[0]).toBe(CENSUS_CSV_COLUMNS.map(column => column.name).join(','))
    const parsed = parseCensusCsv(CENSUS_CSV_TEMPLATE)
    expect(parsed.problems).toEqual([])
    expect(parsed.rows).toEqual([
      { row: 2, data: { year: 2023, adults: 148, males: 70, females: 71, method: 'mark-recapture', source: 'Spring survey report 2023' } },
      { row: 3, data: { year: 2024, adults: 153, males: null, females: null, method: 'transect count', source: 'Field notes, K. Example' } },
    ])
  })

  it('accepts any column order and case, semicolons, a byte-order mark, blank lines and short rows', () => {
    const parsed = parseCensusCsv('\uFEFF Adults ;YEAR;females\n\n12;2019\n14;2020;7\n')
    expect(parsed.problems).toEqual([])
    expect(parsed.rows).toEqual([
      { row: 3, data: { year: 2019, adults: 12, females: null } },
      { row: 4, data: { year: 2020, adults: 14, females: 7 } },
    ])
  })

  it('names the row (header = row 1) and column of every problem, and returns no rows then', () => {
    const csv = 'year,adults,males,females\n2019,10,4,5\n2020,-1,,\n2021,10,6,5\n2022,ten,,\n2019,9,,\n'
    const parsed = parseCensusCsv(csv)
    expect(parsed.rows).toEqual([])
    expect(parsed.problems).toEqual([
      { row: 3, column: 'adults', message: 'Row 3, adults: Adults cannot be negative.' },
      { row: 4, column: 'females', message: 'Row 4, females: Males and females together (11) cannot be more than adults (10).' },
      { row: 5, column: 'adults', message: 'Row 5, adults: "ten" is not a number.' },
      { row: 6, column: 'year', message: 'Row 6, year: 2019 appears twice (also row 2); keep one row per year.' },
    ])
  })

  it('refuses header problems before reading rows', () => {
    expect(parseCensusCsv('').problems[0]).toMatchObject({ row: 1, message: expect.stringMatching(/empty/) })
    expect(parseCensusCsv('year,adults,colour\n2020,1,red\n').problems).toEqual([
      { row: 1, column: 'colour', message: 'Unknown column "colour". The columns are: year, adults, males, females, method, source.' },
    ])
    expect(parseCensusCsv('year,year,adults\n').problems[0]).toMatchObject({ column: 'year', message: expect.stringMatching(/appears twice/) })
    expect(parseCensusCsv('adults\n5\n').problems).toEqual([{ row: 1, column: 'year', message: 'The header row has no "year" column (required).' }])
    expect(parseCensusCsv('year,adults\n').problems).toEqual([{ row: 2, column: null, message: 'The file has a header row but no census rows.' }])
  })

  it('refuses extra cells and thousands separators with a reason', () => {
    expect(parseCensusCsv('year,adults,source\n2020,5,Report, vol 2\n').problems[0]?.message).toMatch(/Row 2 has 4 cells but the header has 3/)
    expect(parseCensusCsv('year,adults\n2020,"1,250"\n').problems[0]?.message).toMatch(/without thousands separators/)
    // Trailing empty cells are not extra cells.
    expect(parseCensusCsv('year,adults\n2020,5,,\n').problems).toEqual([])
  })

  it('stops at the row limit and at a bounded number of problems', () => {
    const tooMany = ['year,adults', ...Array.from({ length: CENSUS_IMPORT_MAX_ROWS + 1 }, (_, i) => `${1800 + (i % 400)},1`)].join('\n')
    expect(parseCensusCsv(tooMany).problems).toEqual([{ row: 2, column: null, message: `The file has ${CENSUS_IMPORT_MAX_ROWS + 1} census rows; at most ${CENSUS_IMPORT_MAX_ROWS} are read in one import. Split it into smaller files.` }])
    const allBad = ['year,adults', ...Array.from({ length: 200 }, (_, i) => `${1900 + i},-1`)].join('\n')
    expect(parseCensusCsv(allBad).problems).toHaveLength(MAX_REPORTED_PROBLEMS)
  })

  it('round-trips any valid series written as CSV (property)', () => {
    const row = fc.record({
      adults: fc.integer({ min: 0, max: 5000 }),
      share: fc.option(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }))),
      method: fc.constantFrom('', 'mark-recapture', 'count; "visual"', 'transect, north'),
    })
    fc.assert(fc.property(fc.uniqueArray(fc.integer({ min: 1800, max: 2200 }), { minLength: 1, maxLength: 30 }), fc.array(row, { minLength: 30, maxLength: 30 }), (years, rows) => {
      const expected = years.map((year, i) => {
        const { adults, share, method } = rows[i]!
        const males = share ? Math.floor(adults * share[0] / 2) : null
        const females = share ? Math.floor(adults * share[1] / 2) : null
        return { year, adults, males, females, method, source: '' }
      })
      const quote = (text: string) => (/[",;\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text)
      const csv = ['year,adults,males,females,method,source', ...expected.map(r => [r.year, r.adults, r.males ?? '', r.females ?? '', quote(r.method), ''].join(','))].join('\r\n')
      const parsed = parseCensusCsv(csv)
      expect(parsed.problems).toEqual([])
      expect(parsed.rows.map(r => r.data)).toEqual(expected)
      expect(parsed.rows.map(r => r.row)).toEqual(expected.map((_, i) => i + 2))
    }), { numRuns: 150, seed: 7 })
  })
})
