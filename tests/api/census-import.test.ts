/**
 * POST /api/subpopulations/:id/census/import: a CSV as text/csv or JSON { csv, mode }. All or
 * nothing: one bad row answers 422 naming the row and column and stores nothing; years already
 * recorded are refused in 'add' mode and overwritten in 'replace' mode; roles, another agency,
 * size limit (413) and the audit event.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { CENSUS_CSV_TEMPLATE, CENSUS_IMPORT_MAX_BYTES } from '../../shared/schemas/census'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword } from './auth-support'

const server = useServer()

let viewer: ApiClient
let biologist: ApiClient
let otherAdmin: ApiClient
let subpopulationId: number

async function rowsOf(id: number): Promise<{ year: number, adults: number, males: number | null, females: number | null, method: string, source: string }[]> {
  const result = await server.db.query('SELECT year, adults, males, females, method, source FROM census_counts WHERE subpopulation_id = $1 ORDER BY year', [id])
  return result.rows
}

beforeAll(async () => {
  const other = await createOtherAgency(server)
  const found = await server.db.query<{ id: number }>(`SELECT id FROM subpopulations WHERE name = 'Silverthread Branch'`)
  subpopulationId = found.rows[0]!.id // the demo seed has this subpopulation
  viewer = await server.signIn(demo.viewer)
  biologist = await server.signIn(demo.biologist)
  otherAdmin = await server.signIn(other.adminEmail, otherAgencyPassword)
})

const url = (id: number, query = '') => `/api/subpopulations/${id}/census/import${query}`
const asCsv = { 'content-type': 'text/csv' }

describe('census CSV import', () => {
  it('imports the downloadable template as a file (text/csv) and as JSON', async () => {
    const asFile = await biologist.request('POST', url(subpopulationId), CENSUS_CSV_TEMPLATE.replace('2023', '1995').replace('2024', '1996'), asCsv)
    expect(asFile.status, JSON.stringify(asFile.body)).toBe(201)
    expect(asFile.body).toMatchObject({ created: 2, updated: 0 })
    expect(asFile.body.items.map((row: { year: number }) => row.year)).toEqual((await rowsOf(subpopulationId)).map(row => row.year))
    const stored = (await rowsOf(subpopulationId)).filter(row => row.year < 2000)
    expect(stored).toEqual([
      { year: 1995, adults: 148, males: 70, females: 71, method: 'mark-recapture', source: 'Spring survey report 2023' },
      { year: 1996, adults: 153, males: null, females: null, method: 'transect count', source: 'Field notes, K. Example' },
    ])

    const asJson = await biologist.post(url(subpopulationId), { csv: 'Year; Adults; Females\n1997; 12; 6\n', mode: 'add' })
    expect(asJson.status, JSON.stringify(asJson.body)).toBe(201)
    expect((await rowsOf(subpopulationId)).find(row => row.year === 1997)).toMatchObject({ adults: 12, males: null, females: 6 })
    const audit = await server.db.query(`SELECT after FROM audit_events WHERE action = 'census.import' AND entity_id = $1 ORDER BY id`, [subpopulationId])
    expect(audit.rows.map(row => row.after)).toEqual([
      { mode: 'add', createdYears: [1995, 1996], updatedYears: [], rows: 2 },
      { mode: 'add', createdYears: [1997], updatedYears: [], rows: 1 },
    ])
  })

  it('refuses a file with one bad row: 422 naming the row and column, nothing stored', async () => {
    const before = await rowsOf(subpopulationId)
    const csv = [
      'year,adults,males,females,method,source',
      '1980,30,12,14,transect,Survey A',
      '1981,-2,,,transect,Survey A',
      '1982,25,20,10,transect,Survey A',
    ].join('\n')
    const response = await biologist.request('POST', url(subpopulationId), csv, asCsv)
    expectErrorAnswer(response, 422, /^Nothing was imported\. Row 3, adults: Adults cannot be negative\. \(and 1 more problem\)$/)
    expect(response.body.issues).toEqual([
      { path: 'rows.3.adults', message: 'Row 3, adults: Adults cannot be negative.' },
      { path: 'rows.4.females', message: 'Row 4, females: Males and females together (30) cannot be more than adults (25).' },
    ])
    expect(await rowsOf(subpopulationId)).toEqual(before)
  })

  it('names unknown columns, text in number cells, duplicate years and extra cells', async () => {
    const cases: { csv: string, issue: { path: string, message: RegExp } }[] = [
      { csv: 'year,adults,sex\n1980,3,m\n', issue: { path: 'rows.1.sex', message: /Unknown column "sex"/ } },
      { csv: 'adults\n3\n', issue: { path: 'rows.1.year', message: /no "year" column/ } },
      { csv: 'year,adults\n1980,1,200\n', issue: { path: 'rows.2', message: /Row 2 has 3 cells but the header has 2/ } },
      { csv: 'year,adults\n1980,twelve\n', issue: { path: 'rows.2.adults', message: /"twelve" is not a number/ } },
      { csv: 'year,adults\n1980,"1,200"\n', issue: { path: 'rows.2.adults', message: /without thousands separators/ } },
      { csv: 'year,adults\n1980,3\n\n1980,4\n', issue: { path: 'rows.4.year', message: /1980 appears twice \(also row 2\)/ } },
      { csv: 'year,adults\n', issue: { path: 'rows.2', message: /no census rows/ } },
    ]
    for (const { csv, issue } of cases) {
      const response = await biologist.request('POST', url(subpopulationId), csv, asCsv)
      expectErrorAnswer(response, 422)
      expect(response.body.issues[0].path, csv).toBe(issue.path)
      expect(response.body.issues[0].message, csv).toMatch(issue.message)
    }
  })

  it('refuses years already recorded in "add" mode (naming the row) and overwrites them in "replace" mode', async () => {
    const existing = (await rowsOf(subpopulationId)).find(row => row.year === 2024)!
    const csv = `year,adults,method\n1970,5,count\n2024,${existing.adults + 7},recount\n`
    const refused = await biologist.request('POST', url(subpopulationId), csv, asCsv)
    expectErrorAnswer(refused, 422, /Row 3, year: Silverthread Branch already has a census for 2024/)
    expect((await rowsOf(subpopulationId)).some(row => row.year === 1970)).toBe(false)

    const replaced = await biologist.request('POST', url(subpopulationId, '?mode=replace'), csv, asCsv)
    expect(replaced.status).toBe(201)
    expect(replaced.body).toMatchObject({ created: 1, updated: 1 })
    const after = await rowsOf(subpopulationId)
    expect(after.find(row => row.year === 2024)).toMatchObject({ adults: existing.adults + 7, method: 'recount' })
    expect(after.find(row => row.year === 1970)).toMatchObject({ adults: 5 })
    expectErrorAnswer(await biologist.request('POST', url(subpopulationId, '?mode=merge'), csv, asCsv), 422, /Choose add/)
  })

  it('is for writers of the agency only, and refuses files over the limit with 413', async () => {
    const csv = 'year,adults\n1960,3\n'
    expectErrorAnswer(await server.anonymous().request('POST', url(subpopulationId), csv, asCsv), 401)
    expectErrorAnswer(await viewer.request('POST', url(subpopulationId), csv, asCsv), 403)
    expectErrorAnswer(await otherAdmin.request('POST', url(subpopulationId), csv, asCsv), 404)
    const huge = `year,adults,source\n${'1960,3,'.padEnd(CENSUS_IMPORT_MAX_BYTES + 10, 'x')}\n`
    expectErrorAnswer(await biologist.request('POST', url(subpopulationId), huge, asCsv), 413, /too large/)
    expectErrorAnswer(await biologist.post(url(subpopulationId), { csv: huge }), 413, /too large/)
    expectErrorAnswer(await biologist.post(url(subpopulationId), {}), 422, /csv/)
    expect((await rowsOf(subpopulationId)).some(row => row.year === 1960)).toBe(false)
  })
})
