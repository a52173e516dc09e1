/**
 * The Atlas routes around a species: GET /api/species, GET /api/species/:id, the GeoJSON and
 * CSV exports (downloads), the distance table, and the import (GeoJSON or CSV; everything or
 * nothing, with every problem naming its feature or row). Each for every caller: anonymous
 * 401, viewers read (403 on the import), writers import, another agency 404.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import Papa from 'papaparse'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword } from './auth-support'

const server = useServer()

type Caller = 'anonymous' | 'viewer' | 'biologist' | 'manager' | 'administrator' | 'otherAdmin'
const READERS = ['viewer', 'biologist', 'manager', 'administrator'] as const
const WRITERS = ['biologist', 'manager', 'administrator'] as const
let clients: Record<Caller, ApiClient>
let speciesId: number

async function subpopulationCount(): Promise<number> {
  return Number((await server.db.query<{ count: string }>('SELECT count(*) FROM subpopulations WHERE species_id = $1', [speciesId])).rows[0]?.count)
}

function csv(rows: string[]): string {
  return ['name,latitude,longitude,generation_time_years,environment_class', ...rows].join('\n')
}

const polygon = (lon: number, lat: number) => ({ type: 'Polygon', coordinates: [[[lon, lat], [lon + 0.04, lat], [lon + 0.04, lat + 0.03], [lon, lat + 0.03], [lon, lat]]] })

beforeAll(async () => {
  const other = await createOtherAgency(server)
  clients = {
    anonymous: server.anonymous(),
    viewer: await server.signIn(demo.viewer),
    biologist: await server.signIn(demo.biologist),
    manager: await server.signIn(demo.manager),
    administrator: await server.signIn(demo.admin),
    otherAdmin: await server.signIn(other.adminEmail, otherAgencyPassword),
  }
  speciesId = (await server.db.query<{ id: number }>(`SELECT id FROM species WHERE scientific_name = 'Nephelotriton appalachiensis'`)).rows[0]!.id // seeded
})

describe('GET /api/species and /api/species/:id', () => {
  it('401 anonymous; every role reads its agency\'s species with counts; another agency sees none of them (404 by id)', async () => {
    expectErrorAnswer(await clients.anonymous.get('/api/species'), 401)
    expectErrorAnswer(await clients.anonymous.get(`/api/species/${speciesId}`), 401)
    for (const caller of READERS) {
      const list = await clients[caller].get('/api/species')
      expect(list.status).toBe(200)
      expect(list.body.items).toEqual([{ id: speciesId, commonName: 'Mistridge salamander', scientificName: 'Nephelotriton appalachiensis', notes: expect.stringMatching(/invented/i), invented: true, subpopulationCount: 10, version: 0 }])
      expect((await clients[caller].get(`/api/species/${speciesId}`)).body).toMatchObject({ id: speciesId, subpopulationCount: 10 })
    }
    expect((await clients.otherAdmin.get('/api/species')).body.items).toEqual([])
    expectErrorAnswer(await clients.otherAdmin.get(`/api/species/${speciesId}`), 404, /Species not found/)
    expectErrorAnswer(await clients.viewer.get('/api/species/0'), 422)
  })
})

describe('exports', () => {
  it('GeoJSON: a download of every subpopulation with attributes and status; 401 / 404 otherwise', async () => {
    const path = `/api/species/${speciesId}/subpopulations.geojson`
    expectErrorAnswer(await clients.anonymous.get(path), 401)
    expectErrorAnswer(await clients.otherAdmin.get(path), 404)
    for (const caller of READERS) {
      const response = await clients[caller].get(path)
      expect(response.status).toBe(200)
      expect(response.headers.get('content-type')).toMatch(/^application\/geo\+json/)
      expect(response.headers.get('content-disposition')).toBe('attachment; filename="mistridge-salamander-subpopulations.geojson"; filename*=UTF-8\'\'mistridge-salamander-subpopulations.geojson')
      // The test client decodes JSON-like bodies (application/geo+json) itself.
      const collection = typeof response.body === 'string' ? JSON.parse(response.body) : response.body
      expect(collection.type).toBe('FeatureCollection')
      expect(collection.features).toHaveLength(10)
      const quillmoss = collection.features.find((f: { properties: { name: string } }) => f.properties.name === 'Quillmoss Ridge')
      expect(quillmoss.geometry.type).toBe('Polygon')
      expect(quillmoss.properties).toMatchObject({ workingNe: 346, generationTimeYears: 3, status: 'Watch', latestCensusAdults: 1627 })
    }
  })

  it('CSV: one row each with the centroid as latitude/longitude, as a download', async () => {
    const path = `/api/species/${speciesId}/subpopulations.csv`
    expectErrorAnswer(await clients.anonymous.get(path), 401)
    expectErrorAnswer(await clients.otherAdmin.get(path), 404)
    const response = await clients.viewer.get(path)
    expect(response.status).toBe(200)
    expect(response.headers.get('content-type')).toMatch(/^text\/csv/)
    expect(response.headers.get('content-disposition')).toMatch(/^attachment; filename="mistridge-salamander-subpopulations\.csv"/)
    const parsed = Papa.parse<Record<string, string>>(response.body as string, { header: true, skipEmptyLines: true })
    expect(parsed.data).toHaveLength(10)
    const fernwhistle = parsed.data.find(row => row.name === 'Fernwhistle Creek')
    expect(fernwhistle).toMatchObject({ working_ne: '3', status: 'Losing diversity fast', geometry_type: 'Polygon' })
    const centroid = await server.db.query(`SELECT centroid_lat, centroid_lon FROM subpopulations WHERE name = 'Fernwhistle Creek'`)
    expect(Number(fernwhistle?.latitude)).toBe(centroid.rows[0].centroid_lat)
    expect(Number(fernwhistle?.longitude)).toBe(centroid.rows[0].centroid_lon)
  })
})

describe('GET /api/species/:id/distances', () => {
  it('every role reads the matrices and nearest neighbours; 401 / 404 otherwise', async () => {
    const path = `/api/species/${speciesId}/distances`
    expectErrorAnswer(await clients.anonymous.get(path), 401)
    expectErrorAnswer(await clients.otherAdmin.get(path), 404)
    for (const caller of READERS) expect((await clients[caller].get(path)).status).toBe(200)
    const { body } = await clients.viewer.get(path)
    expect(body.items.map((item: { name: string }) => item.name)).toEqual([
      'Ashfern Hollow', 'Brackenveil Knob', 'Cinderbrook Cove', 'Fernwhistle Creek', 'Lanternmoss Gap',
      'Mossgate Plateau', 'Owlfeather Bald', 'Quillmoss Ridge', 'Silverthread Branch', 'Stonelantern Flats',
    ])
    expect(body.centroidKm).toHaveLength(10)
    expect(body.edgeKm).toHaveLength(10)
    expect(body.nearest).toHaveLength(10)
    expect(body.method).toMatch(/6371\.0088 km/)
    // Centroid distance Ashfern Hollow – Quillmoss Ridge from the stored centroids by the haversine formula (R = 6371.0088 km).
    const rows = (await server.db.query(`SELECT name, centroid_lon, centroid_lat FROM subpopulations WHERE name IN ('Ashfern Hollow', 'Quillmoss Ridge') ORDER BY name`)).rows
    const [a, b] = rows
    const rad = Math.PI / 180
    const h = Math.sin((b.centroid_lat - a.centroid_lat) * rad / 2) ** 2 + Math.cos(a.centroid_lat * rad) * Math.cos(b.centroid_lat * rad) * Math.sin((b.centroid_lon - a.centroid_lon) * rad / 2) ** 2
    const haversineKm = 2 * 6371.0088 * Math.asin(Math.sqrt(h))
    expect(Math.abs(body.centroidKm[0][7] - haversineKm)).toBeLessThanOrEqual(0.0005)
    // Boundaries are apart, so the gap is positive and shorter than the distance between centres.
    expect(body.edgeKm[0][7]).toBeGreaterThan(0)
    expect(body.edgeKm[0][7]).toBeLessThan(body.centroidKm[0][7])
    for (let i = 0; i < 10; i += 1) {
      expect(body.edgeKm[i][i]).toBe(0)
      for (let j = 0; j < 10; j += 1) expect(body.edgeKm[i][j]).toBe(body.edgeKm[j][i])
    }
  })
})

describe('POST /api/species/:id/subpopulations/import', () => {
  const path = () => `/api/species/${speciesId}/subpopulations/import`

  it('401 anonymous, 403 viewer, 404 for another agency; nothing stored', async () => {
    const body = { format: 'csv', text: csv(['Seep One,35.5,-83.5,3,seep']) }
    expectErrorAnswer(await clients.anonymous.post(path(), body), 401)
    expectErrorAnswer(await clients.viewer.post(path(), body), 403)
    expectErrorAnswer(await clients.otherAdmin.post(path(), body), 404)
    expect(await subpopulationCount()).toBe(10)
  })

  it('a CSV with one bad row answers 422 naming the row, and stores none of the good rows', async () => {
    const text = csv(['North Seep,35.61,-83.45,3,seep', 'Far North,95,-83.1,3,seep', 'South Seep,35.2,-83.05,2.5,'])
    const response = await clients.biologist.post(path(), { format: 'csv', text })
    expectErrorAnswer(response, 422, /^The file has 1 problem; nothing was imported\. Row 3 \("Far North"\): latitude must be between -90 and 90 degrees, got 95\.$/)
    expect(response.body.issues).toEqual([{ path: 'rows.3.latitude', row: 3, message: 'Row 3 ("Far North"): latitude must be between -90 and 90 degrees, got 95.' }])
    expect(await subpopulationCount()).toBe(10)
  })

  it('reports the file\'s problems and names already taken in one answer', async () => {
    const text = csv(['Quillmoss Ridge,35.5,-83.5,3,', 'Far North,95,-83.1,3,', 'New Seep,35.4,-83.3,,'])
    const response = await clients.biologist.post(path(), { format: 'csv', text })
    expectErrorAnswer(response, 422, /^The file has 3 problems; nothing was imported\./)
    expect(response.body.issues.map((issue: { row: number, message: string }) => [issue.row, issue.message])).toEqual([
      [2, 'Row 2 ("Quillmoss Ridge"): a subpopulation named "Quillmoss Ridge" already exists for this species (choose to update existing ones to replace its boundary and attributes).'],
      [3, 'Row 3 ("Far North"): latitude must be between -90 and 90 degrees, got 95.'],
      [4, 'Row 4 ("New Seep"): generation_time_years is missing; give it in the file or set a default generation time for the import.'],
    ])
    expect(await subpopulationCount()).toBe(10)
  })

  it('each writer role imports a good CSV of points; audit events are written', async () => {
    for (const [index, caller] of WRITERS.entries()) {
      const names = [`${caller} seep A`, `${caller} seep B`]
      const text = csv([`${names[0]},35.${5 + index},-83.4,3,seep`, `${names[1]},35.${5 + index},-83.3,,`])
      const response = await clients[caller].post(path(), { format: 'csv', text, defaultGenerationTimeYears: 2.5 })
      expect(response.status, JSON.stringify(response.body)).toBe(201)
      expect(response.body).toMatchObject({ created: 2, updated: 0 })
      expect(response.body.items.map((item: { name: string, generationTimeYears: number }) => [item.name, item.generationTimeYears])).toEqual([[names[0], 3], [names[1], 2.5]])
      expect(response.body.items[0].geometry).toEqual({ type: 'Point', coordinates: [-83.4, Number(`35.${5 + index}`)] })
      const audits = await server.db.query(`SELECT count(*) FROM audit_events WHERE action = 'subpopulation.import-create' AND entity_id = ANY($1)`, [response.body.items.map((item: { id: number }) => item.id)])
      expect(audits.rows[0].count).toBe('2')
    }
    expect(await subpopulationCount()).toBe(16)
  })

  it('GeoJSON: a bad feature (self-intersecting) answers 422 naming the feature; nothing stored', async () => {
    const before = await subpopulationCount()
    const text = JSON.stringify({
      type: 'FeatureCollection',
      features: [
        { type: 'Feature', properties: { name: 'Good Cove', generationTimeYears: 3 }, geometry: polygon(-83.8, 35.0) },
        { type: 'Feature', properties: { name: 'Twisted Cove', generationTimeYears: 3 }, geometry: { type: 'Polygon', coordinates: [[[-83, 35], [-82.9, 35.1], [-82.9, 35], [-83, 35.1], [-83, 35]]] } },
        { type: 'Feature', properties: { name: 'Open Cove', generationTimeYears: 3 }, geometry: { type: 'Polygon', coordinates: [[[-83.5, 34.9], [-83.4, 34.9], [-83.4, 35]]] } },
      ],
    })
    const response = await clients.manager.post(path(), { format: 'geojson', text })
    expectErrorAnswer(response, 422, /^The file has 3 problems; nothing was imported\. Feature 2 \("Twisted Cove"\): The boundary crosses itself/)
    // Feature 3's ring is both too short and open: two structure problems.
    expect(response.body.issues.map((issue: { feature: number }) => issue.feature)).toEqual([2, 3, 3])
    expect(response.body.issues[1].message).toBe('Feature 3 ("Open Cove"): GeoJSON structure: Expected to find four or more positions here.')
    expect(response.body.issues[2].message).toMatch(/^Feature 3 \("Open Cove"\): GeoJSON structure: First and last positions/)
    expect(await subpopulationCount()).toBe(before)
  })

  it('GeoJSON: a good collection imports with boundaries; an existing name is a problem unless asked to update', async () => {
    const before = await subpopulationCount()
    const collection = {
      type: 'FeatureCollection',
      features: [
        { type: 'Feature', properties: { name: 'Laurel Fold', environment_class: 'cove forest', generationTimeYears: 3, yearsIsolated: 30 }, geometry: polygon(-83.8, 35.0) },
        { type: 'Feature', properties: { name: 'Birch Fold', generationTimeYears: 2 }, geometry: { type: 'MultiPolygon', coordinates: [polygon(-83.7, 35.0).coordinates, polygon(-83.6, 35.0).coordinates] } },
      ],
    }
    const created = await clients.administrator.post(path(), { format: 'geojson', text: JSON.stringify(collection) })
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    expect(created.body.created).toBe(2)
    expect(created.body.items[0]).toMatchObject({ name: 'Laurel Fold', environmentClass: 'cove forest', yearsIsolated: 30 })
    expect(created.body.items[0].areaKm2).toBeGreaterThan(10)
    expect(await subpopulationCount()).toBe(before + 2)

    const again = await clients.administrator.post(path(), { format: 'geojson', text: JSON.stringify(collection) })
    expectErrorAnswer(again, 422, /Feature 1 \("Laurel Fold"\): a subpopulation named "Laurel Fold" already exists for this species/)
    expect(again.body.issues).toHaveLength(2)
    expect(await subpopulationCount()).toBe(before + 2)

    const moved = { ...collection, features: [{ ...collection.features[0], properties: { name: 'laurel fold', yearsIsolated: 31 }, geometry: polygon(-83.85, 35.05) }] }
    const updated = await clients.administrator.post(path(), { format: 'geojson', text: JSON.stringify(moved), onExisting: 'update' })
    expect(updated.status, JSON.stringify(updated.body)).toBe(201)
    expect(updated.body).toMatchObject({ created: 0, updated: 1 })
    expect(updated.body.items[0]).toMatchObject({ name: 'Laurel Fold', yearsIsolated: 31, environmentClass: 'cove forest', version: 1 })
    expect(updated.body.items[0].centroid.lon).toBeCloseTo(-83.83, 2)
  })

  it('all or nothing in the database too: a failure while storing the third record rolls back the first two', async () => {
    const before = await subpopulationCount()
    // A trip wire in this test's private database: inserting this name raises an error mid-import.
    await server.db.query(`CREATE FUNCTION atlas_trip_wire() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN IF NEW.name = 'Trip Wire Seep' THEN RAISE EXCEPTION 'trip wire'; END IF; RETURN NEW; END $$`)
    await server.db.query('CREATE TRIGGER atlas_trip_wire BEFORE INSERT ON subpopulations FOR EACH ROW EXECUTE FUNCTION atlas_trip_wire()')
    try {
      const text = csv(['Stored Then Undone A,35.7,-83.1,3,', 'Stored Then Undone B,35.71,-83.1,3,', 'Trip Wire Seep,35.72,-83.1,3,'])
      const response = await clients.biologist.post(path(), { format: 'csv', text })
      expectErrorAnswer(response, 500)
      expect(await subpopulationCount()).toBe(before)
      const left = await server.db.query(`SELECT count(*) FROM subpopulations WHERE name LIKE 'Stored Then Undone%'`)
      expect(left.rows[0].count).toBe('0')
    } finally {
      await server.db.query('DROP TRIGGER atlas_trip_wire ON subpopulations')
      await server.db.query('DROP FUNCTION atlas_trip_wire()')
    }
  })

  it('bad requests: unknown format, empty text, missing columns, not JSON, too large', async () => {
    expectErrorAnswer(await clients.biologist.post(path(), { format: 'kml', text: 'x' }), 422, /geojson" or "csv"/)
    expectErrorAnswer(await clients.biologist.post(path(), { format: 'csv', text: '' }), 422, /empty/)
    expectErrorAnswer(await clients.biologist.post(path(), { format: 'csv', text: 'site,lat\nA,35' }), 422, /needs the columns name, latitude and longitude/)
    expectErrorAnswer(await clients.biologist.post(path(), { format: 'geojson', text: '{"type": "FeatureCollection", "features": [' }), 422, /not valid JSON/)
    expectErrorAnswer(await clients.biologist.post(path(), { format: 'csv', text: 'x'.repeat(5.5 * 1024 * 1024) }), 413)
  })
})
