/**
 * Bad input on the subpopulation write routes: malformed JSON, wrong types, unknown fields,
 * bad GeoJSON (structure and positions), a self-intersecting polygon, an implausible area,
 * coordinates off the globe, a working Ne without its reason, an oversized body. Each answers
 * 4xx with a readable message and the field's issue — never 500 — and stores nothing.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { expectErrorAnswer } from './auth-support'

const server = useServer()
let biologist: ApiClient
let speciesId: number
let recordId: number

const square = (lon: number, lat: number, size: number) => ({ type: 'Polygon', coordinates: [[[lon, lat], [lon + size, lat], [lon + size, lat + size], [lon, lat + size], [lon, lat]]] })

beforeAll(async () => {
  biologist = await server.signIn(demo.biologist)
  speciesId = (await biologist.get('/api/species')).body.items[0].id
  recordId = (await server.db.query<{ id: number }>(`SELECT id FROM subpopulations WHERE name = 'Ashfern Hollow'`)).rows[0]!.id // seeded
})

async function count(): Promise<number> {
  return Number((await server.db.query<{ count: string }>('SELECT count(*) FROM subpopulations')).rows[0]?.count)
}

/** The geometry issue of a POST with this geometry (and nothing stored). */
async function geometryIssue(geometry: unknown): Promise<string> {
  const before = await count()
  const response = await biologist.post('/api/subpopulations', { speciesId, name: 'Bad shape', generationTimeYears: 3, geometry })
  expectErrorAnswer(response, 422)
  expect(await count()).toBe(before)
  const issue = response.body.issues.find((item: { path: string }) => item.path === 'geometry')
  expect(issue, JSON.stringify(response.body)).toBeDefined()
  expect(response.body.message).toMatch(/^geometry: /)
  return issue.message as string
}

describe('POST /api/subpopulations: boundaries', () => {
  it('bad GeoJSON structure: open ring, too few positions, positions that are not numbers', async () => {
    expect(await geometryIssue({ type: 'Polygon', coordinates: [[[-83, 35], [-82.9, 35], [-82.9, 35.1], [-83, 35.1]]] })).toMatch(/^GeoJSON structure: First and last positions of a Polygon or MultiPolygon’s ring should be the same\./)
    expect(await geometryIssue({ type: 'Polygon', coordinates: [[[-83, 35], [-82.9, 35], [-83, 35]]] })).toMatch(/four or more positions/)
    expect(await geometryIssue({ type: 'Point', coordinates: ['-83', '35'] })).toMatch(/^GeoJSON structure: /)
    expect(await geometryIssue({ type: 'Polygon' })).toMatch(/^GeoJSON structure: /)
  })

  it('wrong geometry type, and not a geometry at all', async () => {
    expect(await geometryIssue({ type: 'LineString', coordinates: [[-83, 35], [-82, 36]] })).toBe('A boundary must be a Polygon, MultiPolygon or Point, not a LineString.')
    expect(await geometryIssue('Polygon')).toBe('The boundary must be a GeoJSON geometry: a Polygon, MultiPolygon or Point.')
  })

  it('a self-intersecting polygon names where it crosses', async () => {
    const bowTie = { type: 'Polygon', coordinates: [[[-83, 35], [-82.9, 35.1], [-82.9, 35], [-83, 35.1], [-83, 35]]] }
    expect(await geometryIssue(bowTie)).toBe('The boundary crosses itself near 35.0500° N, 82.9500° W. Redraw it so its edges do not cross.')
  })

  it('implausible areas and positions off the globe', async () => {
    expect(await geometryIssue(square(-83, 35, 0.0001))).toMatch(/must cover at least 0\.001 km²/)
    expect(await geometryIssue(square(-83, 30, 5))).toMatch(/may cover at most 100,000 km²/)
    expect(await geometryIssue({ type: 'Point', coordinates: [35.6, -183.5] })).toMatch(/latitude -183\.5; latitudes run from -90 to 90/)
  })
})

describe('POST /api/subpopulations: attributes', () => {
  it('400 for malformed JSON; 422 naming each missing field; units in the messages', async () => {
    expectErrorAnswer(await biologist.request('POST', '/api/subpopulations', '{"name": ', { 'content-type': 'application/json' }), 400, /not valid JSON/)
    const empty = await biologist.post('/api/subpopulations', {})
    expectErrorAnswer(empty, 422)
    expect(empty.body.issues.map((issue: { path: string }) => issue.path).sort()).toEqual(['generationTimeYears', 'name', 'speciesId'])
    const bad = await biologist.post('/api/subpopulations', { speciesId, name: 'X', generationTimeYears: -2, yearsIsolated: -1 })
    const messages = Object.fromEntries(bad.body.issues.map((issue: { path: string, message: string }) => [issue.path, issue.message]))
    expect(messages).toEqual({ generationTimeYears: 'The generation time must be more than 0 years.', yearsIsolated: 'Years isolated cannot be negative.' })
  })

  it('wrong types, unknown fields, overlong and control characters in names', async () => {
    const wrong = await biologist.post('/api/subpopulations', { speciesId: 'one', name: 5, generationTimeYears: '3' })
    expectErrorAnswer(wrong, 422)
    expect(wrong.body.issues).toHaveLength(3)
    expectErrorAnswer(await biologist.post('/api/subpopulations', { speciesId, name: 'Extra', generationTimeYears: 3, colour: 'red' }), 422, /Unknown field: colour/)
    expectErrorAnswer(await biologist.post('/api/subpopulations', { speciesId, name: 'x'.repeat(121), generationTimeYears: 3 }), 422, /at most 120 characters/)
    expectErrorAnswer(await biologist.post('/api/subpopulations', { speciesId, name: 'Tab\there', generationTimeYears: 3 }), 422, /control characters/)
    expectErrorAnswer(await biologist.post('/api/subpopulations', { speciesId, name: '   ', generationTimeYears: 3 }), 422, /Enter a name/)
  })

  it('413 for a body over 2 MB', async () => {
    const huge = { speciesId, name: 'Huge', generationTimeYears: 3, notes: 'x'.repeat(2.1 * 1024 * 1024) }
    expectErrorAnswer(await biologist.post('/api/subpopulations', huge), 413, /too large/)
  })
})

describe('PATCH /api/subpopulations/:id', () => {
  it('needs a version; refuses unknown fields, a bad boundary and a working Ne without a reason; nothing changes', async () => {
    expectErrorAnswer(await biologist.patch(`/api/subpopulations/${recordId}`, { name: 'No version' }), 422, /version/)
    expectErrorAnswer(await biologist.patch(`/api/subpopulations/${recordId}`, { speciesId: 2, version: 0 }), 422, /Unknown field: speciesId/)
    const crossing = await biologist.patch(`/api/subpopulations/${recordId}`, { geometry: { type: 'Polygon', coordinates: [[[-83, 35], [-82.9, 35.1], [-82.9, 35], [-83, 35.1], [-83, 35]]] }, version: 0 })
    expectErrorAnswer(crossing, 422, /crosses itself/)
    const reasonless = await biologist.patch(`/api/subpopulations/${recordId}`, { workingNe: 50, version: 0 })
    expectErrorAnswer(reasonless, 422)
    expect(reasonless.body.issues).toEqual([{ path: 'workingNeReason', message: 'Say why this is the working Ne (method, data, judgement).' }])
    expectErrorAnswer(await biologist.patch(`/api/subpopulations/${recordId}`, { workingNe: -1, workingNeReason: 'x', version: 0 }), 422, /more than 0 individuals/)
    expectErrorAnswer(await biologist.patch(`/api/subpopulations/${recordId}`, { workingNeReason: null, version: 0 }), 422, /needs its reason/)
    const row = await server.db.query('SELECT version, working_ne, geometry->>\'type\' AS type FROM subpopulations WHERE id = $1', [recordId])
    expect(row.rows[0]).toEqual({ version: 0, working_ne: 379, type: 'Polygon' })
  })

  it('bad ids: 422 for text, 404 for a number no record has', async () => {
    expectErrorAnswer(await biologist.patch('/api/subpopulations/x1', { version: 0 }), 422, /record number/)
    expectErrorAnswer(await biologist.patch('/api/subpopulations/99999999', { notes: 'x', version: 0 }), 404)
    expectErrorAnswer(await biologist.delete('/api/subpopulations/99999999?version=0'), 404)
    expectErrorAnswer(await biologist.delete(`/api/subpopulations/${recordId}?version=abc`), 422, /version/)
  })
})
