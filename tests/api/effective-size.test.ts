/**
 * Effective-size estimates and the working Ne: GET/POST /api/subpopulations/:id/effective-sizes,
 * DELETE …/effective-sizes/:estimateId and PUT …/working-ne.
 *
 * - The server computes every value with the engine: a posted `value` is refused, and stored
 *   values match the engine's own check values (tests/fixtures/genetics/
 *   effective-size-science-check-values.json: independent mpmath reference computation, SCIENCE.md §5).
 * - The harmonic mean reads the adults of the chosen years from the stored census.
 * - Provenance (method, inputs, value, interval, date, source, who) is kept and listed.
 * - The working Ne needs a reason, matches its estimate, uses optimistic locking, and its
 *   estimate cannot be deleted. Roles, another agency → 404, audit events.
 */
import { readFileSync } from 'node:fs'
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword } from './auth-support'

interface FixtureCase { function: string, input: Record<string, unknown>, expected: number, tolerance: { absolute?: number, relative?: number } }
const fixture = JSON.parse(readFileSync(new URL('../fixtures/genetics/effective-size-science-check-values.json', import.meta.url), 'utf8')) as { source: string, cases: FixtureCase[] }
const casesOf = (name: string) => fixture.cases.filter(entry => entry.function === name)

function expectWithin(actual: number, entry: FixtureCase): void {
  const allowed = entry.tolerance.absolute ?? (entry.tolerance.relative ?? 0) * Math.abs(entry.expected)
  expect(Math.abs(actual - entry.expected), `${entry.function}(${JSON.stringify(entry.input)}) = ${actual}, expected ${entry.expected} ± ${allowed}`).toBeLessThanOrEqual(allowed)
}

const server = useServer()

let viewer: ApiClient
let biologist: ApiClient
let manager: ApiClient
let otherAdmin: ApiClient
let subpopulationId: number
let otherSubpopulationId: number

async function idOf(name: string): Promise<number> {
  const result = await server.db.query<{ id: number }>('SELECT id FROM subpopulations WHERE name = $1', [name])
  return result.rows[0]!.id // the demo seed has these subpopulations
}

async function estimateCount(id: number): Promise<number> {
  const result = await server.db.query<{ count: string }>('SELECT count(*) FROM effective_size_estimates WHERE subpopulation_id = $1', [id])
  return Number(result.rows[0]!.count)
}

const url = (id: number) => `/api/subpopulations/${id}/effective-sizes`

beforeAll(async () => {
  const other = await createOtherAgency(server)
  subpopulationId = await idOf('Brackenveil Knob')
  otherSubpopulationId = await idOf('Ashfern Hollow')
  viewer = await server.signIn(demo.viewer)
  biologist = await server.signIn(demo.biologist)
  manager = await server.signIn(demo.manager)
  otherAdmin = await server.signIn(other.adminEmail, otherAgencyPassword)
})

describe('the server computes the estimate', () => {
  it(`stores the engine's value for sex ratio, family-size variance and Ne/N ratio (${fixture.source.slice(0, 40)}…)`, async () => {
    for (const entry of casesOf('effectiveSizeFromSexRatio')) {
      const response = await biologist.post(url(subpopulationId), { method: 'sex-ratio', inputs: entry.input })
      expect(response.status, JSON.stringify(response.body)).toBe(201)
      expectWithin(response.body.value, entry)
      const stored = await server.db.query('SELECT value, inputs, method FROM effective_size_estimates WHERE id = $1', [response.body.id])
      expectWithin(stored.rows[0].value, entry)
      expect(stored.rows[0]).toMatchObject({ method: 'sex-ratio', inputs: entry.input })
    }
    for (const entry of casesOf('effectiveSizeFromFamilyVariance')) {
      const response = await biologist.post(url(subpopulationId), { method: 'family-size-variance', inputs: entry.input })
      expect(response.status).toBe(201)
      expectWithin(response.body.value, entry)
    }
    for (const entry of casesOf('effectiveSizeFromRatio')) {
      const response = await biologist.post(url(subpopulationId), { method: 'ne-n-ratio', inputs: { ...entry.input, ratio: 0.1, ratioLow: 0.05, ratioHigh: 0.3 } })
      expect(response.status).toBe(201)
      expectWithin(response.body.value, entry)
      expect(response.body.intervalLow).toBeCloseTo(50, 9) // 0.05 × 1000
      expect(response.body.intervalHigh).toBeCloseTo(300, 9) // 0.3 × 1000
    }
  })

  it('computes the harmonic mean from the stored census adults of the chosen years', async () => {
    const cases = casesOf('effectiveSizeHarmonicMean')
    for (const [index, entry] of cases.entries()) {
      const sizes = entry.input.sizes as number[]
      const years = sizes.map((_, offset) => 1850 + 10 * index + offset)
      for (const [offset, adults] of sizes.entries()) {
        const census = await biologist.post(`/api/subpopulations/${subpopulationId}/census`, { year: years[offset], adults })
        expect(census.status).toBe(201)
      }
      const response = await biologist.post(url(subpopulationId), { method: 'harmonic-mean', inputs: { years } })
      expect(response.status, JSON.stringify(response.body)).toBe(201)
      expectWithin(response.body.value, entry)
      expect(response.body.inputs).toEqual({ years, sizes, basis: 'adult census counts, each census year taken as one generation' })
    }
  })

  it('refuses a posted value (nothing stored) and inputs the formula cannot take', async () => {
    const before = await estimateCount(subpopulationId)
    const faked = await biologist.post(url(subpopulationId), { method: 'sex-ratio', inputs: { males: 10, females: 40 }, value: 9999 })
    expectErrorAnswer(faked, 422, /Unknown field: value/)
    const fakedInside = await biologist.post(url(subpopulationId), { method: 'sex-ratio', inputs: { males: 10, females: 40, value: 9999 } })
    expectErrorAnswer(fakedInside, 422, /Unknown field: value/)
    expect(fakedInside.body.issues[0].path).toBe('inputs')

    expectErrorAnswer(await biologist.post(url(subpopulationId), { method: 'sex-ratio', inputs: { males: 0, females: 40 } }), 422, /greater than 0/)
    expectErrorAnswer(await biologist.post(url(subpopulationId), { method: 'family-size-variance', inputs: { census: 0.5, familySizeVariance: 2 } }), 422, /at least 1/)
    expectErrorAnswer(await biologist.post(url(subpopulationId), { method: 'family-size-variance', inputs: { census: 20, familySizeVariance: -1 } }), 422, /cannot be negative/)
    const range = await biologist.post(url(subpopulationId), { method: 'ne-n-ratio', inputs: { census: 100, ratio: 0.1, ratioLow: 0.2, ratioHigh: 0.3 } })
    expect(range.body.issues).toEqual([{ path: 'inputs.ratioLow', message: 'The low end must not be above the ratio.' }])
    expectErrorAnswer(await biologist.post(url(subpopulationId), { method: 'guess', inputs: {} }), 422, /Choose a method/)
    expectErrorAnswer(await biologist.post(url(subpopulationId), { method: 'harmonic-mean', inputs: { years: [1700, 2024] } }), 422, /year between/)
    expectErrorAnswer(await biologist.post(url(subpopulationId), { method: 'harmonic-mean', inputs: { years: [2020, 2020] } }), 422, /once/)
    const missing = await biologist.post(url(subpopulationId), { method: 'harmonic-mean', inputs: { years: [2024, 1801] } })
    expectErrorAnswer(missing, 422, /No census for 1801/)
    expect(missing.body.issues[0].path).toBe('inputs.years')
    await biologist.post(`/api/subpopulations/${subpopulationId}/census`, { year: 1802, adults: 0 })
    expectErrorAnswer(await biologist.post(url(subpopulationId), { method: 'harmonic-mean', inputs: { years: [2024, 1802] } }), 422, /counted no adults/)
    expectErrorAnswer(await biologist.post(url(subpopulationId), { method: 'sex-ratio', inputs: { males: 1, females: 1 }, estimatedOn: '2025-02-30' }), 422, /real date/)
    expect(await estimateCount(subpopulationId)).toBe(before)
  })
})

describe('provenance and roles', () => {
  it('lists estimates with method, inputs, value, interval, date, source and who; any role reads, another agency 404', async () => {
    const posted = await manager.post(url(subpopulationId), { method: 'sex-ratio', inputs: { males: 63, females: 57, year: 2023 }, estimatedOn: '2026-01-15' })
    expect(posted.status).toBe(201)
    for (const client of [viewer, biologist, manager]) {
      const list = await client.get(url(subpopulationId))
      expect(list.status).toBe(200)
      const item = list.body.items.find((entry: { id: number }) => entry.id === posted.body.id)
      expect(item).toMatchObject({
        method: 'sex-ratio', methodLabel: 'Sex ratio', inputs: { males: 63, females: 57, year: 2023 },
        estimatedOn: '2026-01-15', source: 'Census 2023: breeding males and females',
        createdBy: { name: expect.any(String) }, intervalLow: null, intervalHigh: null, isWorking: false,
      })
      expect(item.value).toBeCloseTo(4 * 63 * 57 / 120, 10)
    }
    // The seeded estimates (recorded without a creator) are listed too.
    const seeded = await server.db.query('SELECT count(*)::int AS n FROM effective_size_estimates WHERE subpopulation_id = $1', [subpopulationId])
    expect((await viewer.get(url(subpopulationId))).body.items).toHaveLength(seeded.rows[0].n)
    expectErrorAnswer(await server.anonymous().get(url(subpopulationId)), 401)
    expectErrorAnswer(await otherAdmin.get(url(subpopulationId)), 404)
    const audit = await server.db.query(`SELECT actor_id, after FROM audit_events WHERE action = 'effective-size.create' AND entity_id = $1`, [posted.body.id])
    expect(audit.rows[0].after).toMatchObject({ method: 'sex-ratio', source: 'Census 2023: breeding males and females' })
  })

  it('lets biologists, managers and administrators save and delete; viewers 403; another agency 404', async () => {
    const body = { method: 'family-size-variance', inputs: { census: 30, familySizeVariance: 4 }, source: 'Nest monitoring 2019–2024' }
    expectErrorAnswer(await viewer.post(url(subpopulationId), body), 403)
    expectErrorAnswer(await otherAdmin.post(url(subpopulationId), body), 404)
    const saved = await biologist.post(url(subpopulationId), body)
    expect(saved.body.source).toBe('Nest monitoring 2019–2024')
    const path = `${url(subpopulationId)}/${saved.body.id}`
    expectErrorAnswer(await viewer.delete(path), 403)
    expectErrorAnswer(await otherAdmin.delete(path), 404)
    expectErrorAnswer(await biologist.delete(`${url(otherSubpopulationId)}/${saved.body.id}`), 404, /Estimate not found/)
    expect((await manager.delete(path)).status).toBe(200)
    expectErrorAnswer(await manager.delete(path), 404)
  })
})

describe('PUT /api/subpopulations/:id/working-ne', () => {
  async function current(): Promise<{ version: number }> {
    return (await viewer.get(url(subpopulationId))).body.working
  }

  it('sets the working Ne from an estimate with a reason, records who and when, and protects that estimate', async () => {
    const estimate = (await biologist.post(url(subpopulationId), { method: 'sex-ratio', inputs: { males: 20, females: 30 } })).body
    const { version } = await current()
    const path = `/api/subpopulations/${subpopulationId}/working-ne`
    expectErrorAnswer(await viewer.put(path, { value: estimate.value, estimateId: estimate.id, reason: 'Latest sexed census.', version }), 403)
    expectErrorAnswer(await otherAdmin.put(path, { value: estimate.value, estimateId: estimate.id, reason: 'Latest sexed census.', version }), 404)
    expectErrorAnswer(await biologist.put(path, { value: estimate.value, estimateId: estimate.id, version }), 422, /Write why/)
    expectErrorAnswer(await biologist.put(path, { value: estimate.value, estimateId: estimate.id, reason: 'short', version }), 422, /at least 10/)
    const mismatch = await biologist.put(path, { value: estimate.value + 1, estimateId: estimate.id, reason: 'Latest sexed census.', version })
    expectErrorAnswer(mismatch, 422, /chosen estimate is 48/)
    expect(mismatch.body.issues[0].path).toBe('value')
    const foreign = (await biologist.get(url(otherSubpopulationId))).body.items[0]
    expectErrorAnswer(await biologist.put(path, { value: foreign.value, estimateId: foreign.id, reason: 'Borrowed from a neighbour.', version }), 422, /no saved estimate/)

    const chosen = await biologist.put(path, { value: estimate.value, estimateId: estimate.id, reason: 'Latest sexed census; family sizes unknown.', version })
    expect(chosen.status, JSON.stringify(chosen.body)).toBe(200)
    expect(chosen.body).toMatchObject({ value: 48, estimateId: estimate.id, reason: 'Latest sexed census; family sizes unknown.', setBy: { name: expect.any(String) }, version: version + 1 })
    expect(Date.now() - Date.parse(chosen.body.setAt)).toBeLessThan(60_000)

    const list = await viewer.get(url(subpopulationId))
    expect(list.body.working).toMatchObject({ value: 48, estimateId: estimate.id })
    expect(list.body.items.filter((item: { isWorking: boolean }) => item.isWorking).map((item: { id: number }) => item.id)).toEqual([estimate.id])
    const row = await server.db.query('SELECT working_ne, working_ne_reason, working_ne_estimate_id FROM subpopulations WHERE id = $1', [subpopulationId])
    expect(row.rows[0]).toEqual({ working_ne: 48, working_ne_reason: 'Latest sexed census; family sizes unknown.', working_ne_estimate_id: estimate.id })

    expectErrorAnswer(await biologist.delete(`${url(subpopulationId)}/${estimate.id}`), 409, /source of the working Ne/)
    expectErrorAnswer(await manager.put(path, { value: 50, reason: 'Rounded expert figure.', version }), 409, /Someone else changed Brackenveil Knob/)

    const expert = await manager.put(path, { value: 50, reason: 'Rounded expert figure after the 2024 workshop.', version: version + 1 })
    expect(expert.body).toMatchObject({ value: 50, estimateId: null })
    expect((await biologist.delete(`${url(subpopulationId)}/${estimate.id}`)).status).toBe(200)
    const audit = await server.db.query(`SELECT after FROM audit_events WHERE action = 'subpopulation.working-ne' AND entity_id = $1 ORDER BY id`, [subpopulationId])
    expect(audit.rows.map(entry => entry.after.value)).toEqual([48, 50])
  })

  it('drops the estimate link when the working Ne is changed through PATCH /api/subpopulations/:id', async () => {
    const path = `/api/subpopulations/${subpopulationId}/working-ne`
    const estimate = (await biologist.post(url(subpopulationId), { method: 'sex-ratio', inputs: { males: 9, females: 9 } })).body
    const { version } = await current()
    expect((await biologist.put(path, { value: estimate.value, estimateId: estimate.id, reason: 'Equal sexes in the last count.', version })).status).toBe(200)
    const patched = await biologist.patch(`/api/subpopulations/${subpopulationId}`, { workingNe: 77, workingNeReason: 'Typed into the attributes form.', version: version + 1 })
    expect(patched.status, JSON.stringify(patched.body)).toBe(200)
    const list = await viewer.get(url(subpopulationId))
    expect(list.body.working).toMatchObject({ value: 77, estimateId: null })
    expect(list.body.items.some((item: { isWorking: boolean }) => item.isWorking)).toBe(false)
    // The estimate no longer stands behind the working Ne, so it may go.
    expect((await biologist.delete(`${url(subpopulationId)}/${estimate.id}`)).status).toBe(200)
    const row = await server.db.query('SELECT working_ne, working_ne_estimate_id FROM subpopulations WHERE id = $1', [subpopulationId])
    expect(row.rows[0]).toEqual({ working_ne: 77, working_ne_estimate_id: null })
  })

  it('clears the working Ne with a reason, and refuses malformed input', async () => {
    const path = `/api/subpopulations/${subpopulationId}/working-ne`
    const { version } = await current()
    expectErrorAnswer(await biologist.put(path, { value: 0, reason: 'Nothing left to count.', version }), 422, /at least 0.5/)
    expectErrorAnswer(await biologist.put(path, { value: '50', reason: 'Typed as text by mistake.', version }), 422, /number/)
    expectErrorAnswer(await biologist.request('PUT', path, '{"value":', { 'content-type': 'application/json' }), 400)
    const cleared = await biologist.put(path, { value: null, reason: 'Estimates disagree; waiting for genotypes.', version })
    expect(cleared.body).toMatchObject({ value: null, reason: null, estimateId: null })
    const audit = await server.db.query(`SELECT after FROM audit_events WHERE action = 'subpopulation.working-ne' AND entity_id = $1 ORDER BY id DESC LIMIT 1`, [subpopulationId])
    expect(audit.rows[0].after).toMatchObject({ value: null, reason: 'Estimates disagree; waiting for genotypes.' })
  })
})
