/**
 * Bad input on every proposal and scenario route: malformed JSON, bodies that are not objects,
 * missing fields, wrong types, out-of-range values, overlong text, oversized bodies, form posts,
 * bad ids in the address and bad query values. Each answers 4xx with a readable `message`
 * (and `issues` by path for 422), never 500, and changes nothing.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { expectErrorAnswer } from './auth-support'
import { createProposal, demoRecords, scenarioInputs } from './proposals-support'

const server = useServer()
let biologist: ApiClient
let records: Awaited<ReturnType<typeof demoRecords>>
let proposalId: number
let scenarioId: number
let baselineId: number

beforeAll(async () => {
  biologist = await server.signIn(demo.biologist)
  records = await demoRecords(server)
  const detail = await createProposal(biologist, { title: 'Bad input target', recipientId: records.fernwhistle, sourceSubpopulationIds: [records.lanternmoss] })
  proposalId = detail.proposal.id
  baselineId = detail.scenarios[0].id
  scenarioId = detail.scenarios[1].id
})

const long = (n: number) => 'x'.repeat(n)

interface BodyRoute {
  method: 'POST' | 'PATCH'
  path: () => string
  wrongTypes: () => Record<string, unknown>
  /** Paths that must be reported for the wrong-type body. */
  wrongTypePaths: string[]
  overlong: () => Record<string, unknown>
  required: string[]
  maxBytes: number
}

const routes: BodyRoute[] = [
  {
    method: 'POST', path: () => '/api/proposals',
    wrongTypes: () => ({ title: 5, recipientId: 'one', purpose: [], sourceSubpopulationIds: 'all', captiveSource: 3 }),
    wrongTypePaths: ['title', 'recipientId', 'purpose', 'sourceSubpopulationIds', 'captiveSource'],
    overlong: () => ({ title: long(201), recipientId: records.fernwhistle }),
    required: ['title', 'recipientId'], maxBytes: 64 * 1024,
  },
  {
    method: 'PATCH', path: () => `/api/proposals/${proposalId}`,
    wrongTypes: () => ({ title: 1, narrative: 'text', outbreedingAnswers: { sameSpecies: { value: 'maybe' } }, checklist: { permits: { done: 'yes' } }, recommendedScenarioId: 'x', version: '0' }),
    wrongTypePaths: ['title', 'narrative', 'outbreedingAnswers.sameSpecies.value', 'checklist.permits.done', 'recommendedScenarioId', 'version'],
    overlong: () => ({ narrative: { rationale: long(20_001) }, version: 0 }),
    required: ['version'], maxBytes: 256 * 1024,
  },
  {
    method: 'POST', path: () => `/api/proposals/${proposalId}/scenarios`,
    wrongTypes: () => ({ name: 7, inputs: { schedule: 'weekly', sourceSubpopulationId: 'x', variants: {}, load: 12, horizonYears: 'long' } }),
    wrongTypePaths: ['name', 'inputs.schedule', 'inputs.sourceSubpopulationId', 'inputs.variants', 'inputs.load', 'inputs.horizonYears'],
    overlong: () => ({ name: long(121), inputs: scenarioInputs(null) }),
    required: ['name', 'inputs'], maxBytes: 64 * 1024,
  },
  {
    method: 'PATCH', path: () => `/api/scenarios/${scenarioId}`,
    wrongTypes: () => ({ name: false, inputs: [], version: -1 }),
    wrongTypePaths: ['name', 'inputs', 'version'],
    overlong: () => ({ name: long(500), version: 0 }),
    required: ['version'], maxBytes: 64 * 1024,
  },
]

describe.each(routes)('$method body routes', (route) => {
  const send = (body: unknown, headers: Record<string, string> = {}) => biologist.request(route.method, route.path(), body, headers)

  it('400 malformed JSON; 422 for {}, empty and non-object bodies, naming the missing fields', async () => {
    expectErrorAnswer(await send('{"title": ', { 'content-type': 'application/json' }), 400, /not valid JSON/)
    for (const body of [{}, '']) {
      const response = await send(body, { 'content-type': 'application/json' })
      expectErrorAnswer(response, 422)
      expect(response.body.issues.map((i: { path: string }) => i.path)).toEqual(expect.arrayContaining(route.required))
    }
    for (const body of ['[]', '"text"', '42', 'null']) expectErrorAnswer(await send(body, { 'content-type': 'application/json' }), 422)
  })

  it('422 for wrong types, each reported at its path in plain words', async () => {
    const response = await send(route.wrongTypes())
    expectErrorAnswer(response, 422)
    const paths = response.body.issues.map((i: { path: string }) => i.path)
    expect(paths).toEqual(expect.arrayContaining(route.wrongTypePaths))
    for (const issue of response.body.issues) expect(issue.message).not.toMatch(/Invalid input|expected .* received/)
  })

  it('422 for overlong text, 413 for an oversized body, 415 for a form post', async () => {
    expectErrorAnswer(await send(route.overlong()), 422, /at most/)
    expectErrorAnswer(await send({ ...route.overlong(), padding: long(route.maxBytes + 1000) }), 413, /too large/)
    expectErrorAnswer(await send('title=x', { 'content-type': 'application/x-www-form-urlencoded' }), 415)
  })
})

describe('value rules of the proposal schemas', () => {
  it('POST /api/proposals: more than 10 sources, duplicate sources, unknown fields', async () => {
    const many = await biologist.post('/api/proposals', { title: 'Many', recipientId: records.fernwhistle, sourceSubpopulationIds: Array.from({ length: 11 }, (_, i) => i + 1000) })
    expectErrorAnswer(many, 422, /at most 10/)
    expectErrorAnswer(await biologist.post('/api/proposals', { title: 'Dup', recipientId: records.fernwhistle, sourceSubpopulationIds: [records.lanternmoss, records.lanternmoss] }), 422, /once/)
    const unknown = await biologist.post('/api/proposals', { title: 'Extra', recipientId: records.fernwhistle, status: 'approved' })
    expectErrorAnswer(unknown, 422, /Unknown field: status/)
    expectErrorAnswer(await biologist.post('/api/proposals', { title: '   ', recipientId: records.fernwhistle }), 422, /Enter a title/)
  })

  it('PATCH /api/proposals/:id: unknown checklist items and narrative sections, bad screen answers', async () => {
    const url = `/api/proposals/${proposalId}`
    const item = await biologist.patch(url, { checklist: { 'parking-permit': { done: true } }, version: 0 })
    expectErrorAnswer(item, 422)
    expect(item.body.issues[0].path).toBe('checklist')
    expectErrorAnswer(await biologist.patch(url, { narrative: { poem: 'x' }, version: 0 }), 422, /Unknown field: poem/)
    const answer = await biologist.patch(url, { outbreedingAnswers: { sameSpecies: { value: 'perhaps' } }, version: 0 })
    expect(answer.body.issues).toEqual([{ path: 'outbreedingAnswers.sameSpecies.value', message: 'Answer yes, no or not known.' }])
    const version = await biologist.patch(url, { title: 'X', version: 1.5 })
    expect(version.body.issues).toEqual([{ path: 'version', message: 'Send the version you loaded (a whole number).' }])
    const row = await server.db.query('SELECT title, version FROM proposals WHERE id = $1', [proposalId])
    expect(row.rows[0]).toEqual({ title: 'Bad input target', version: 0 })
  })

  it('scenario inputs: schedule sums, ranges that must contain their value, load citations, horizon', async () => {
    const url = `/api/proposals/${proposalId}/scenarios`
    const post = (inputs: Record<string, unknown>) => biologist.post(url, { name: 'Bad', inputs })
    const paths = async (inputs: Record<string, unknown>) => {
      const response = await post(inputs)
      expectErrorAnswer(response, 422)
      return response.body.issues.map((i: { path: string }) => i.path) as string[]
    }
    const good = scenarioInputs(records.lanternmoss)
    expect(await paths({ ...good, schedule: { ...good.schedule, males: 4 } })).toEqual(['inputs.schedule.males'])
    expect(await paths({ ...good, schedule: { ...good.schedule, events: 0 } })).toEqual(['inputs.schedule.events'])
    expect(await paths({ ...good, schedule: { ...good.schedule, intervalYears: 0 } })).toEqual(['inputs.schedule.intervalYears'])
    expect(await paths({ ...good, schedule: { ...good.schedule, animalsPerEvent: 501, females: 501, males: 0 } })).toEqual(['inputs.schedule.animalsPerEvent'])
    const variant = good.variants[0]!
    expect(await paths({ ...good, variants: [{ ...variant, sourceFrequency: 0 }] })).toEqual(['inputs.variants.0.sourceFrequency'])
    expect(await paths({ ...good, variants: [{ ...variant, s: 0.2 }] })).toEqual(['inputs.variants.0.sRange'])
    expect(await paths({ ...good, variants: [{ ...variant, h: 2, hRange: [-5, 5], s: 0.5, sRange: [0.1, 0.9] }] })).toEqual(['inputs.variants.0.hRange'])
    expect(await paths({ ...good, variants: Array.from({ length: 6 }, () => variant) })).toEqual(['inputs.variants'])
    expect(await paths({ ...good, load: { ...good.load, citation: 'my-uncle' } })).toEqual(['inputs.load.citation'])
    expect(await paths({ ...good, load: { ...good.load, diploidLethalEquivalents: 60, range: [1, 70] } })).toEqual(expect.arrayContaining(['inputs.load.diploidLethalEquivalents']))
    expect(await paths({ ...good, horizonYears: 501 })).toEqual(['inputs.horizonYears'])
    expect(await paths({ ...good, recipientOverrides: { initialInbreeding: 1 } })).toEqual(['inputs.recipientOverrides.initialInbreeding'])
    expect(await paths({ ...good, recipientOverrides: { census: 0.5 } })).toEqual(['inputs.recipientOverrides.census'])
  })

  it('PATCH /api/scenarios/:id on the baseline validates before the baseline rule', async () => {
    const response = await biologist.patch(`/api/scenarios/${baselineId}`, { inputs: { horizonYears: 0 }, version: 0 })
    expectErrorAnswer(response, 422)
  })
})

describe('addresses and query strings', () => {
  it('422 for ids that are not record numbers on every route with an id', async () => {
    for (const id of ['abc', '0', '-3', '1.5', '99999999999', '1e3', '9999999999']) {
      expectErrorAnswer(await biologist.get(`/api/proposals/${id}`), 422, /record number/)
      expectErrorAnswer(await biologist.patch(`/api/proposals/${id}`, { version: 0 }), 422, /record number/)
      expectErrorAnswer(await biologist.delete(`/api/proposals/${id}`), 422, /record number/)
      expectErrorAnswer(await biologist.get(`/api/proposals/${id}/scenarios`), 422, /record number/)
      expectErrorAnswer(await biologist.post(`/api/proposals/${id}/scenarios`, { name: 'x', inputs: scenarioInputs(null) }), 422, /record number/)
      expectErrorAnswer(await biologist.get(`/api/proposals/${id}/versions`), 422, /record number/)
      expectErrorAnswer(await biologist.patch(`/api/scenarios/${id}`, { version: 0 }), 422, /record number/)
      expectErrorAnswer(await biologist.delete(`/api/scenarios/${id}`), 422, /record number/)
    }
    for (const version of ['x', '-1', '1.5', '99999999999']) {
      expectErrorAnswer(await biologist.get(`/api/proposals/${proposalId}/versions/${version}`), 422, /version/)
    }
  })

  it('422 for bad list filters and delete versions', async () => {
    for (const query of ['status=lost', 'recipientId=abc', 'recipientId=0', 'mine=yes', 'recipientId=99999999999']) {
      expectErrorAnswer(await biologist.get(`/api/proposals?${query}`), 422)
    }
    expect((await biologist.get(`/api/proposals?status=draft&recipientId=${records.fernwhistle}&mine=true`)).status).toBe(200)
    expectErrorAnswer(await biologist.delete(`/api/proposals/${proposalId}?version=abc`), 422, /version/)
    expectErrorAnswer(await biologist.delete(`/api/scenarios/${scenarioId}?version=-1`), 422, /version/)
    expect((await server.db.query('SELECT count(*) FROM proposals WHERE id = $1', [proposalId])).rows[0].count).toBe('1')
  })
})
