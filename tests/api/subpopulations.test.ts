/**
 * The subpopulation routes (GET list, GET one, POST, PATCH, DELETE) for every caller:
 * anonymous 401, viewers read only (403 on writes), biologists, managers and administrators
 * write, another agency's administrator 404 on the demo agency's records. Writes are checked
 * in the database (row, derived centroid and area, audit event), optimistic locking answers
 * 409, and deleting a record that proposals or files refer to answers 409 with the reason.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword, userId } from './auth-support'

const server = useServer()

type Caller = 'anonymous' | 'viewer' | 'biologist' | 'manager' | 'administrator' | 'otherAdmin'
const WRITERS = ['biologist', 'manager', 'administrator'] as const
let clients: Record<Caller, ApiClient>
let speciesId: number
let otherSpeciesId: number
let quillmossId: number

/** A square boundary of about 0.05° (≈ 25 km²) in the southern Appalachians. */
function square(lon: number, lat: number, size = 0.05) {
  return { type: 'Polygon', coordinates: [[[lon, lat], [lon + size, lat], [lon + size, lat + size], [lon, lat + size], [lon, lat]]] }
}

async function auditCount(entityId: number, action: string): Promise<number> {
  const result = await server.db.query<{ count: string }>('SELECT count(*) FROM audit_events WHERE entity_type = $1 AND entity_id = $2 AND action = $3', ['subpopulation', entityId, action])
  return Number(result.rows[0]?.count ?? 0)
}

async function create(client: ApiClient, name: string, extra: Record<string, unknown> = {}) {
  return client.post('/api/subpopulations', { speciesId, name, generationTimeYears: 3, geometry: square(-83.9, 35.3), ...extra })
}

beforeAll(async () => {
  const other = await createOtherAgency(server)
  const species = await server.db.query<{ id: number }>(`INSERT INTO species (agency_id, common_name, scientific_name) VALUES ($1, 'Basin minnow (invented)', 'Inventus basinensis') RETURNING id`, [other.agencyId])
  otherSpeciesId = species.rows[0]!.id // one row inserted
  clients = {
    anonymous: server.anonymous(),
    viewer: await server.signIn(demo.viewer),
    biologist: await server.signIn(demo.biologist),
    manager: await server.signIn(demo.manager),
    administrator: await server.signIn(demo.admin),
    otherAdmin: await server.signIn(other.adminEmail, otherAgencyPassword),
  }
  const list = await clients.viewer.get('/api/species')
  speciesId = list.body.items[0].id
  const row = await server.db.query<{ id: number }>(`SELECT id FROM subpopulations WHERE name = 'Quillmoss Ridge'`)
  quillmossId = row.rows[0]!.id // seeded demo record
})

describe('GET /api/subpopulations', () => {
  it('401 anonymous; every role of the agency reads the list with status and figures', async () => {
    expectErrorAnswer(await clients.anonymous.get(`/api/subpopulations?speciesId=${speciesId}`), 401)
    for (const caller of ['viewer', ...WRITERS] as const) {
      const response = await clients[caller].get(`/api/subpopulations?speciesId=${speciesId}`)
      expect(response.status, caller).toBe(200)
      expect(response.body.items).toHaveLength(10)
    }
    const { body } = await clients.viewer.get(`/api/subpopulations?speciesId=${speciesId}`)
    const quillmoss = body.items.find((item: { name: string }) => item.name === 'Quillmoss Ridge')
    // Seeded: working Ne 346 (seeds/demo/subpopulations.json) → F₁₀ = 1 − (1 − 1/692)¹⁰.
    expect(quillmoss).toMatchObject({
      id: quillmossId, speciesId, workingNe: 346, generationTimeYears: 3, yearsIsolated: 12, environmentClass: 'spruce-fir summit forest',
      latestCensus: { year: 2024, adults: 1627 },
      latestEstimate: { method: 'ne-n-ratio', value: 345.8, estimatedOn: '2025-06-03' },
      effectiveSize: { value: 346, basis: 'working', method: null },
      status: { key: 'watch', label: 'Watch', generations: 10, neBand: '100-499' },
      version: 0,
    })
    expect(quillmoss.status.projectedInbreeding).toBeCloseTo(1 - (1 - 1 / 692) ** 10, 14)
    expect(quillmoss.geometry.type).toBe('Polygon')
    expect(quillmoss.centroid.lon).toBeCloseTo(-83.52, 1)
    expect(quillmoss.areaKm2).toBeGreaterThan(0)
    // Records without a working Ne use their latest estimate (Silverthread Branch: harmonic mean 534.2).
    const silverthread = body.items.find((item: { name: string }) => item.name === 'Silverthread Branch')
    expect(silverthread.effectiveSize).toMatchObject({ value: 534.2, basis: 'estimate', method: 'harmonic-mean' })
    expect(silverthread.status.key).toBe('stable')
  })

  it('another agency: 404 for the demo species, and its own (empty) list otherwise', async () => {
    expectErrorAnswer(await clients.otherAdmin.get(`/api/subpopulations?speciesId=${speciesId}`), 404, /Species not found/)
    const own = await clients.otherAdmin.get('/api/subpopulations')
    expect(own.status).toBe(200)
    expect(own.body.items).toEqual([])
    const mine = await clients.viewer.get('/api/subpopulations')
    expect(mine.body.items.length).toBeGreaterThanOrEqual(10)
  })

  it('422 for a malformed speciesId', async () => {
    const response = await clients.viewer.get('/api/subpopulations?speciesId=abc')
    expectErrorAnswer(response, 422, /speciesId/)
  })
})

describe('GET /api/subpopulations/:id', () => {
  it('401 anonymous, 200 for every role with species and proposal count, 404 for another agency', async () => {
    expectErrorAnswer(await clients.anonymous.get(`/api/subpopulations/${quillmossId}`), 401)
    // The demo proposals may name this record as recipient or source: count them in the database itself.
    const counted = await server.db.query<{ count: string }>(
      'SELECT count(*) FROM proposals WHERE recipient_id = $1 OR $1 = ANY (source_subpopulation_ids)', [quillmossId])
    const proposalCount = Number(counted.rows[0]!.count)
    for (const caller of ['viewer', ...WRITERS] as const) {
      const response = await clients[caller].get(`/api/subpopulations/${quillmossId}`)
      expect(response.status, caller).toBe(200)
      expect(response.body).toMatchObject({ id: quillmossId, name: 'Quillmoss Ridge', species: { id: speciesId, commonName: 'Mistridge salamander', invented: true }, proposalCount })
    }
    expectErrorAnswer(await clients.otherAdmin.get(`/api/subpopulations/${quillmossId}`), 404, /Subpopulation not found/)
    expectErrorAnswer(await clients.viewer.get('/api/subpopulations/999999'), 404)
    expectErrorAnswer(await clients.viewer.get('/api/subpopulations/abc'), 422)
  })
})

describe('POST /api/subpopulations', () => {
  it('401 anonymous, 403 viewer, 404 for another agency\'s species', async () => {
    expectErrorAnswer(await create(clients.anonymous, 'Nope'), 401)
    const viewer = await create(clients.viewer, 'Nope')
    expectErrorAnswer(viewer, 403)
    expect(viewer.body.message).toBe('Your role (viewer) cannot do this: it needs biologist, manager or administrator.')
    expectErrorAnswer(await create(clients.otherAdmin, 'Nope'), 404, /Species not found/)
    expectErrorAnswer(await clients.biologist.post('/api/subpopulations', { speciesId: otherSpeciesId, name: 'Across', generationTimeYears: 2 }), 404)
    const rows = await server.db.query(`SELECT id FROM subpopulations WHERE name IN ('Nope', 'Across')`)
    expect(rows.rowCount).toBe(0)
  })

  it('biologists, managers and administrators create; centroid and area are derived; an audit event is written', async () => {
    for (const [index, caller] of WRITERS.entries()) {
      const name = `Created by ${caller}`
      const response = await create(clients[caller], name, { environmentClass: '  cove forest ', yearsIsolated: 7, geometry: square(-83.9 + index * 0.1, 35.3) })
      expect(response.status, JSON.stringify(response.body)).toBe(201)
      expect(response.body).toMatchObject({ name, environmentClass: 'cove forest', yearsIsolated: 7, generationTimeYears: 3, version: 0, effectiveSize: { basis: 'none' }, status: { key: 'unknown' } })
      const row = await server.db.query('SELECT centroid_lon, centroid_lat, area_km2, agency_id FROM subpopulations WHERE id = $1', [response.body.id])
      // Centre of the 0.05° square; area ≈ (0.05·111.195)·(0.05·111.195·cos 35.325°) ≈ 25.2 km² (planar estimate).
      expect(row.rows[0].centroid_lon).toBeCloseTo(-83.875 + index * 0.1, 3)
      expect(row.rows[0].centroid_lat).toBeCloseTo(35.325, 3)
      expect(row.rows[0].area_km2).toBeGreaterThan(24.5)
      expect(row.rows[0].area_km2).toBeLessThan(25.9)
      expect(await auditCount(response.body.id, 'subpopulation.create')).toBe(1)
    }
  })

  it('a point, or no geometry at all, is accepted', async () => {
    const point = await create(clients.biologist, 'Spring seep', { geometry: { type: 'Point', coordinates: [-83.7, 35.5] } })
    expect(point.status).toBe(201)
    expect(point.body).toMatchObject({ centroid: { lon: -83.7, lat: 35.5 }, areaKm2: 0 })
    const none = await create(clients.biologist, 'Somewhere unmapped', { geometry: null })
    expect(none.status).toBe(201)
    expect(none.body).toMatchObject({ geometry: null, centroid: null, areaKm2: null })
  })

  it('409 when the species already has that name (case ignored)', async () => {
    const response = await create(clients.biologist, 'quillmoss ridge')
    expectErrorAnswer(response, 409, /A subpopulation named "Quillmoss Ridge" already exists/)
  })
})

describe('PATCH /api/subpopulations/:id', () => {
  it('401 anonymous, 403 viewer, 404 for another agency; nothing changes', async () => {
    const body = { name: 'Renamed', version: 0 }
    expectErrorAnswer(await clients.anonymous.patch(`/api/subpopulations/${quillmossId}`, body), 401)
    expectErrorAnswer(await clients.viewer.patch(`/api/subpopulations/${quillmossId}`, body), 403)
    expectErrorAnswer(await clients.otherAdmin.patch(`/api/subpopulations/${quillmossId}`, body), 404)
    const row = await server.db.query('SELECT name, version FROM subpopulations WHERE id = $1', [quillmossId])
    expect(row.rows[0]).toEqual({ name: 'Quillmoss Ridge', version: 0 })
  })

  it('each writer role saves a new boundary (area and centroid derived again) with its version; audit before/after', async () => {
    const created = (await create(clients.biologist, 'Boundary moves')).body
    let version = created.version
    for (const [index, caller] of WRITERS.entries()) {
      const geometry = square(-83.2, 35.1 + index * 0.01, 0.1)
      const response = await clients[caller].patch(`/api/subpopulations/${created.id}`, { geometry, version })
      expect(response.status, JSON.stringify(response.body)).toBe(200)
      expect(response.body.version).toBe(version + 1)
      expect(response.body.centroid.lat).toBeCloseTo(35.15 + index * 0.01, 3)
      expect(response.body.areaKm2).toBeGreaterThan(99)
      version = response.body.version
    }
    expect(await auditCount(created.id, 'subpopulation.update')).toBe(3)
    const audit = await server.db.query(`SELECT before, after FROM audit_events WHERE entity_id = $1 AND action = 'subpopulation.update' ORDER BY id LIMIT 1`, [created.id])
    expect(audit.rows[0].before.geometry).toEqual(square(-83.9, 35.3))
    expect(audit.rows[0].after.geometry).toEqual(square(-83.2, 35.1, 0.1))
  })

  it('409 with an explanation when the version is stale; the newer save is kept', async () => {
    const created = (await create(clients.biologist, 'Two editors')).body
    const first = await clients.biologist.patch(`/api/subpopulations/${created.id}`, { environmentClass: 'first', version: created.version })
    expect(first.status).toBe(200)
    const second = await clients.manager.patch(`/api/subpopulations/${created.id}`, { environmentClass: 'second', version: created.version })
    expectErrorAnswer(second, 409, /Someone else saved "Two editors" since you loaded it \(you had version 0, it is now 1\)\. Reload/)
    const row = await server.db.query('SELECT environment_class, version FROM subpopulations WHERE id = $1', [created.id])
    expect(row.rows[0]).toEqual({ environment_class: 'first', version: 1 })
  })

  it('removes the boundary with geometry: null; sets and clears the working Ne with its reason', async () => {
    const created = (await create(clients.biologist, 'Working figures')).body
    const cleared = await clients.biologist.patch(`/api/subpopulations/${created.id}`, { geometry: null, version: 0 })
    expect(cleared.body).toMatchObject({ geometry: null, centroid: null, areaKm2: null, version: 1 })
    const working = await clients.biologist.patch(`/api/subpopulations/${created.id}`, { workingNe: 40, workingNeReason: 'Sex-ratio estimate, 2024', version: 1 })
    expect(working.body).toMatchObject({ workingNe: 40, workingNeReason: 'Sex-ratio estimate, 2024', effectiveSize: { value: 40, basis: 'working' }, status: { key: 'critical' } })
    const gone = await clients.biologist.patch(`/api/subpopulations/${created.id}`, { workingNe: null, version: 2 })
    expect(gone.body).toMatchObject({ workingNe: null, workingNeReason: null })
  })

  it('409 when renaming to a name the species has', async () => {
    const created = (await create(clients.biologist, 'Rename me')).body
    expectErrorAnswer(await clients.biologist.patch(`/api/subpopulations/${created.id}`, { name: 'Ashfern Hollow', version: 0 }), 409, /already exists/)
  })
})

describe('DELETE /api/subpopulations/:id', () => {
  it('401 anonymous, 403 viewer, 404 for another agency; every writer role deletes (with its census and estimates)', async () => {
    const target = (await create(clients.biologist, 'Short lived')).body
    expectErrorAnswer(await clients.anonymous.delete(`/api/subpopulations/${target.id}?version=0`), 401)
    expectErrorAnswer(await clients.viewer.delete(`/api/subpopulations/${target.id}?version=0`), 403)
    expectErrorAnswer(await clients.otherAdmin.delete(`/api/subpopulations/${target.id}?version=0`), 404)
    for (const caller of WRITERS) {
      const item = (await create(clients.biologist, `Delete by ${caller}`)).body
      await server.db.query('INSERT INTO census_counts (subpopulation_id, year, adults) VALUES ($1, 2024, 40)', [item.id])
      const response = await clients[caller].delete(`/api/subpopulations/${item.id}?version=0`)
      expect(response.status, JSON.stringify(response.body)).toBe(200)
      expect(response.body.message).toMatch(/was deleted/)
      const left = await server.db.query('SELECT (SELECT count(*) FROM subpopulations WHERE id = $1) AS rows, (SELECT count(*) FROM census_counts WHERE subpopulation_id = $1) AS census', [item.id])
      expect(left.rows[0]).toEqual({ rows: '0', census: '0' })
      expect(await auditCount(item.id, 'subpopulation.delete')).toBe(1)
    }
  })

  it('409 naming the proposals that refer to it (as recipient or source); nothing is deleted', async () => {
    const author = await userId(server, demo.biologist)
    const recipient = (await create(clients.biologist, 'Proposed recipient')).body
    const source = (await create(clients.biologist, 'Proposed source')).body
    await server.db.query(
      `INSERT INTO proposals (agency_id, recipient_id, title, author_id, source_subpopulation_ids)
       SELECT agency_id, $1, 'Rescue for the recipient', $2, ARRAY[$3]::integer[] FROM subpopulations WHERE id = $1`,
      [recipient.id, author, source.id],
    )
    expectErrorAnswer(await clients.manager.delete(`/api/subpopulations/${recipient.id}?version=0`), 409, /cannot be deleted: a proposal names it \("Rescue for the recipient"\)/)
    expectErrorAnswer(await clients.manager.delete(`/api/subpopulations/${source.id}?version=0`), 409, /a proposal names it/)
    const detail = await clients.viewer.get(`/api/subpopulations/${recipient.id}`)
    expect(detail.body.proposalCount).toBe(1)
    const rows = await server.db.query('SELECT count(*) FROM subpopulations WHERE id = ANY($1)', [[recipient.id, source.id]])
    expect(rows.rows[0].count).toBe('2')
  })

  it('409 when any other record still refers to it (here: a monitoring observation of a proposal)', async () => {
    const author = await userId(server, demo.biologist)
    const watched = (await create(clients.biologist, 'Watched seep')).body
    const recipient = (await create(clients.biologist, 'Watched recipient')).body
    const proposal = await server.db.query<{ id: number }>(
      `INSERT INTO proposals (agency_id, recipient_id, title, author_id) SELECT agency_id, $1, 'Monitoring only', $2 FROM subpopulations WHERE id = $1 RETURNING id`,
      [recipient.id, author],
    )
    await server.db.query(
      `INSERT INTO monitoring_observations (proposal_id, subpopulation_id, observed_on, census, source, recorded_by) VALUES ($1, $2, DATE '2025-05-01', 12, 'invented survey', $3)`,
      [proposal.rows[0]!.id, watched.id, author], // one proposal row returned
    )
    expectErrorAnswer(await clients.biologist.delete(`/api/subpopulations/${watched.id}?version=0`), 409, /other records still refer to it/)
    expect((await server.db.query('SELECT count(*) FROM subpopulations WHERE id = $1', [watched.id])).rows[0].count).toBe('1')
  })

  it('409 while files are attached, and 409 for a stale version', async () => {
    const item = (await create(clients.biologist, 'With a permit')).body
    await server.db.query(
      `INSERT INTO attachments (agency_id, owner_type, owner_id, storage_key, file_name, content_type, size_bytes, checksum_sha256)
       SELECT agency_id, 'subpopulation', id, 'test/permit.pdf', 'permit.pdf', 'application/pdf', 10, repeat('a', 64) FROM subpopulations WHERE id = $1`,
      [item.id],
    )
    expectErrorAnswer(await clients.biologist.delete(`/api/subpopulations/${item.id}?version=0`), 409, /while it has 1 attached file\. Remove them on its record page first/)
    const other = (await create(clients.biologist, 'Edited meanwhile')).body
    await clients.manager.patch(`/api/subpopulations/${other.id}`, { notes: 'changed', version: 0 })
    expectErrorAnswer(await clients.biologist.delete(`/api/subpopulations/${other.id}?version=0`), 409, /since you loaded it/)
    expectErrorAnswer(await clients.biologist.delete(`/api/subpopulations/${other.id}`), 422, /version/)
  })
})
