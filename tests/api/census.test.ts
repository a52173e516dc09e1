/**
 * Census rows of a subpopulation: GET/POST /api/subpopulations/:id/census and
 * PATCH/DELETE /api/subpopulations/:id/census/:censusId — who may call them (each role, another
 * agency → 404), the row rules (counts ≥ 0, males + females ≤ adults, one row per year),
 * optimistic locking, bad input, and the audit trail written with each change.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword } from './auth-support'

const server = useServer()

let viewer: ApiClient
let biologist: ApiClient
let manager: ApiClient
let admin: ApiClient
let otherAdmin: ApiClient
let subpopulationId: number
let otherSubpopulationId: number

async function subpopulationIdByName(name: string): Promise<number> {
  const result = await server.db.query<{ id: number }>('SELECT id FROM subpopulations WHERE name = $1', [name])
  const row = result.rows[0]
  if (!row) throw new Error(`no subpopulation ${name}`)
  return row.id
}

async function storedRows(id: number): Promise<{ year: number, adults: number, males: number | null, females: number | null }[]> {
  const result = await server.db.query('SELECT year, adults, males, females FROM census_counts WHERE subpopulation_id = $1 ORDER BY year', [id])
  return result.rows
}

beforeAll(async () => {
  const other = await createOtherAgency(server)
  subpopulationId = await subpopulationIdByName('Stonelantern Flats')
  otherSubpopulationId = await subpopulationIdByName('Owlfeather Bald')
  viewer = await server.signIn(demo.viewer)
  biologist = await server.signIn(demo.biologist)
  manager = await server.signIn(demo.manager)
  admin = await server.signIn(demo.admin)
  otherAdmin = await server.signIn(other.adminEmail, otherAgencyPassword)
})

const url = (id: number) => `/api/subpopulations/${id}/census`

describe('GET /api/subpopulations/:id/census', () => {
  it('lists the series oldest first for every role of the agency; 401 anonymous; 404 for another agency', async () => {
    expectErrorAnswer(await server.anonymous().get(url(subpopulationId)), 401)
    const stored = await storedRows(subpopulationId)
    expect(stored.length).toBeGreaterThan(3)
    for (const client of [viewer, biologist, manager, admin]) {
      const response = await client.get(url(subpopulationId))
      expect(response.status).toBe(200)
      expect(response.body.items.map((row: { year: number }) => row.year)).toEqual(stored.map(row => row.year))
      expect(response.body.items[0]).toMatchObject({ subpopulationId, adults: stored[0]!.adults, version: expect.any(Number) })
    }
    expectErrorAnswer(await otherAdmin.get(url(subpopulationId)), 404, /Subpopulation not found/)
    expectErrorAnswer(await viewer.get(url(999_999)), 404, /Subpopulation not found/)
    expectErrorAnswer(await viewer.get('/api/subpopulations/abc/census'), 422, /record number/)
  })
})

describe('POST /api/subpopulations/:id/census', () => {
  it('adds a row for biologists, managers and administrators; viewers 403; another agency 404; audit written', async () => {
    expectErrorAnswer(await server.anonymous().post(url(subpopulationId), { year: 1990, adults: 5 }), 401)
    expectErrorAnswer(await viewer.post(url(subpopulationId), { year: 1990, adults: 5 }), 403, /needs biologist, manager or administrator/)
    expectErrorAnswer(await otherAdmin.post(url(subpopulationId), { year: 1990, adults: 5 }), 404)

    const created = await biologist.post(url(subpopulationId), { year: 1990, adults: 40, males: 18, females: 20, method: 'transect count', source: 'Survey 1990' })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ year: 1990, adults: 40, males: 18, females: 20, method: 'transect count', source: 'Survey 1990', version: 0 })
    expect((await manager.post(url(subpopulationId), { year: 1991, adults: 41 })).status).toBe(201)
    expect((await admin.post(url(subpopulationId), { year: 1992, adults: 42, males: null, females: 12 })).status).toBe(201)

    const rows = await storedRows(subpopulationId)
    expect(rows.filter(row => row.year >= 1990 && row.year <= 1992)).toEqual([
      { year: 1990, adults: 40, males: 18, females: 20 },
      { year: 1991, adults: 41, males: null, females: null },
      { year: 1992, adults: 42, males: null, females: 12 },
    ])
    const audit = await server.db.query(`SELECT action, entity_type, after FROM audit_events WHERE action = 'census.create' AND entity_id = $1`, [created.body.id])
    expect(audit.rows[0]).toMatchObject({ entity_type: 'census_count', after: { year: 1990, adults: 40 } })
  })

  it('refuses negative counts and sexes above adults (422 at the field), nothing stored', async () => {
    const before = await storedRows(subpopulationId)
    const negative = await biologist.post(url(subpopulationId), { year: 1980, adults: -1 })
    expectErrorAnswer(negative, 422, /adults/i)
    expect(negative.body.issues).toContainEqual({ path: 'adults', message: 'Adults cannot be negative.' })

    const sexes = await biologist.post(url(subpopulationId), { year: 1980, adults: 10, males: 6, females: 5 })
    expectErrorAnswer(sexes, 422)
    expect(sexes.body.issues).toEqual([{ path: 'females', message: 'Males and females together (11) cannot be more than adults (10).' }])

    const males = await biologist.post(url(subpopulationId), { year: 1980, adults: 10, males: 11 })
    expect(males.body.issues).toContainEqual({ path: 'males', message: 'Males (11) cannot be more than adults (10).' })

    const wrongTypes = await biologist.post(url(subpopulationId), { year: '1980', adults: 2.5, males: 'x' })
    expectErrorAnswer(wrongTypes, 422)
    expect(wrongTypes.body.issues.map((issue: { path: string }) => issue.path).sort()).toEqual(['adults', 'males', 'year'])

    expectErrorAnswer(await biologist.post(url(subpopulationId), { year: 1700, adults: 1 }), 422, /year between 1800 and 2200/)
    expectErrorAnswer(await biologist.post(url(subpopulationId), {}), 422, /year/)
    expectErrorAnswer(await biologist.request('POST', url(subpopulationId), '{"year": 19', { 'content-type': 'application/json' }), 400, /not valid JSON/)
    expect(await storedRows(subpopulationId)).toEqual(before)
  })

  it('keeps one row per year: a second row for a year answers 409 naming the year', async () => {
    const year = (await storedRows(subpopulationId))[0]!.year
    const response = await biologist.post(url(subpopulationId), { year, adults: 3 })
    expectErrorAnswer(response, 409, new RegExp(`already has a census for ${year}`))
  })
})

describe('PATCH and DELETE /api/subpopulations/:id/census/:censusId', () => {
  async function freshRow(year: number, adults = 30): Promise<{ id: number, version: number }> {
    const response = await biologist.post(url(subpopulationId), { year, adults })
    expect(response.status).toBe(201)
    return response.body
  }

  it('edits a row with its version; a stale version answers 409; viewers 403; another agency 404', async () => {
    const row = await freshRow(2001)
    const path = `${url(subpopulationId)}/${row.id}`
    expectErrorAnswer(await viewer.patch(path, { adults: 31, version: row.version }), 403)
    expectErrorAnswer(await otherAdmin.patch(path, { adults: 31, version: row.version }), 404)
    const changed = await manager.patch(path, { adults: 31, males: 10, females: 11, version: row.version })
    expect(changed.status).toBe(200)
    expect(changed.body).toMatchObject({ year: 2001, adults: 31, males: 10, females: 11, version: row.version + 1 })
    expectErrorAnswer(await biologist.patch(path, { adults: 32, version: row.version }), 409, /Someone else changed the 2001 census/)
    const audit = await server.db.query(`SELECT before, after FROM audit_events WHERE action = 'census.update' AND entity_id = $1`, [row.id])
    expect(audit.rows[0]).toMatchObject({ before: { adults: 30 }, after: { adults: 31 } })
  })

  it('checks the merged row (422 at the field), a year that is taken (409) and the row belongs to the subpopulation (404)', async () => {
    const row = await freshRow(2002, 20)
    const path = `${url(subpopulationId)}/${row.id}`
    const tooMany = await biologist.patch(path, { males: 15, females: 15, version: row.version })
    expectErrorAnswer(tooMany, 422)
    expect(tooMany.body.issues).toEqual([{ path: 'females', message: 'Males and females together (30) cannot be more than adults (20).' }])
    expectErrorAnswer(await biologist.patch(path, { adults: -4, version: row.version }), 422, /cannot be negative/)
    expectErrorAnswer(await biologist.patch(path, { year: 2001, version: row.version }), 409, /already has a census for 2001/)
    expectErrorAnswer(await biologist.patch(path, { adults: 21 }), 422, /version/)
    // The row id exists, but under another subpopulation of the same agency.
    expectErrorAnswer(await biologist.patch(`${url(otherSubpopulationId)}/${row.id}`, { adults: 21, version: row.version }), 404, /Census row not found/)
    expect((await storedRows(subpopulationId)).find(stored => stored.year === 2002)).toEqual({ year: 2002, adults: 20, males: null, females: null })
    // Clearing a count is allowed (null = not recorded).
    const withSexes = await biologist.patch(path, { males: 8, females: 9, version: row.version })
    const cleared = await biologist.patch(path, { males: null, version: withSexes.body.version })
    expect(cleared.body).toMatchObject({ males: null, females: 9 })
  })

  it('deletes a row for writers only, and records it in the audit log', async () => {
    const row = await freshRow(2003)
    const path = `${url(subpopulationId)}/${row.id}`
    expectErrorAnswer(await viewer.delete(path), 403)
    expectErrorAnswer(await otherAdmin.delete(path), 404)
    expectErrorAnswer(await biologist.delete(`${url(otherSubpopulationId)}/${row.id}`), 404)
    const deleted = await admin.delete(path)
    expect(deleted.status).toBe(200)
    expect(deleted.body.message).toMatch(/2003 census was deleted/)
    expect((await storedRows(subpopulationId)).some(stored => stored.year === 2003)).toBe(false)
    expectErrorAnswer(await admin.delete(path), 404)
    const audit = await server.db.query(`SELECT before FROM audit_events WHERE action = 'census.delete' AND entity_id = $1`, [row.id])
    expect(audit.rows[0]?.before).toMatchObject({ year: 2003, adults: 30 })
  })
})
