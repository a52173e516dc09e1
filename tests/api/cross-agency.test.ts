/**
 * No record of another agency is reachable by guessing its id, on any route. Every route file
 * under server/api with an id in its path is read from disk (a new route is swept without being
 * listed here; one whose id the sweep cannot fill fails). For each, signed in as the
 * administrator and as the biologist of a second agency and aimed at the demo agency's record:
 * - the answer is 404 "… not found." — never the record, never a 403 that depends on the record
 *   (the biologist may get the role refusal every id gets, for administrator-only routes);
 * - it is exactly the answer for an id that exists nowhere (so nothing tells the two apart);
 * - nothing is written anywhere in the database.
 * The demo agency's own administrator reads the same records (the ids are real).
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient, ApiResponse } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword } from './auth-support'
import { scenarioInputs } from './proposals-support'
import { databaseFingerprint, demoIds, fillPattern, idFor, scanApiRoutes, type ApiRoute, type DemoIds } from './security-support'

const server = useServer()

/** Path parameters that are not record ids, and why they are not swept here. */
const NOT_RECORD_IDS: Record<string, string> = {
  '/api/auth/tokens/[token]': 'a one-time token from an e-mail, not an id (unknown, used and expired tokens: tests/api/auth.test.ts)',
}

/** Larger than any id the test database will hand out. */
const MISSING_ID = 2_000_000_000

const routesWithIds = scanApiRoutes().filter(route => route.params.length > 0 && !NOT_RECORD_IDS[route.pattern])

let ids: DemoIds
let owner: ApiClient
let outsiders: { label: string, client: ApiClient }[]

beforeAll(async () => {
  owner = await server.signIn(demo.admin)
  ids = await demoIds(server, await server.signIn(demo.biologist))
  const other = await createOtherAgency(server)
  outsiders = [
    { label: 'other agency administrator', client: await server.signIn(other.adminEmail, otherAgencyPassword) },
    { label: 'other agency biologist', client: await server.signIn(other.biologistEmail, otherAgencyPassword) },
  ]
})

/**
 * A body (or query) each write route would accept from its own agency, so the answer is about
 * the record, not about the input: routes validate their input before they look the record up.
 * Writes not listed here answer 404 with any body (an empty object is sent).
 */
const VALID_INPUT: Record<string, { body?: Record<string, unknown>, query?: string }> = {
  'PATCH /api/admin/users/[id]': { body: { role: 'viewer', version: 0 } },
  'PATCH /api/proposals/[id]': { body: { title: 'Taken over', version: 0 } },
  'POST /api/proposals/[id]/comments': { body: { body: 'A comment from elsewhere.' } },
  'POST /api/proposals/[id]/decision': { body: { decision: 'approve', comment: 'Approved from elsewhere.' } },
  'POST /api/proposals/[id]/observations': { body: { observedOn: '2025-03-01', census: 70, source: 'Survey (test)' } },
  'PUT /api/proposals/[id]/reviewer': { body: { reviewerId: null } },
  'POST /api/proposals/[id]/scenarios': { body: { name: 'Elsewhere', inputs: scenarioInputs(null) } },
  'POST /api/proposals/[id]/translocations': { body: { movedOn: '2025-03-01', sourceId: null, sourceNote: 'Captive colony (invented)', animals: [{ id: 'X-1', sex: 'male' }] } },
  'PATCH /api/scenarios/[id]': { body: { name: 'Renamed elsewhere', version: 0 } },
  'POST /api/species/[id]/subpopulations/import': { body: { format: 'csv', text: 'name,latitude,longitude\nElsewhere Pond,45.1,-70.2\n' } },
  'DELETE /api/subpopulations/[id]': { query: '?version=0' },
  'PATCH /api/subpopulations/[id]': { body: { notes: 'changed elsewhere', version: 0 } },
  'POST /api/subpopulations/[id]/census': { body: { year: 1990, adults: 12 } },
  'PATCH /api/subpopulations/[id]/census/[censusId]': { body: { adults: 13, version: 0 } },
  'POST /api/subpopulations/[id]/effective-sizes': { body: { method: 'sex-ratio', inputs: { males: 10, females: 12 } } },
  'PUT /api/subpopulations/[id]/working-ne': { body: { value: 40, reason: 'Chosen from elsewhere for the test.', version: 0 } },
}

/** Sends the route's method with its valid input (an empty JSON body for other writes). */
function call(client: ApiClient, route: ApiRoute, path: string): Promise<ApiResponse> {
  const input = VALID_INPUT[`${route.method} ${route.pattern}`] ?? {}
  const url = `${path}${input.query ?? ''}`
  return route.method === 'GET' || route.method === 'DELETE' ? client.request(route.method, url) : client.request(route.method, url, input.body ?? {})
}

/** A refusal by role (same for every id, so it tells nothing about the record). */
const ROLE_REFUSAL = /^Your role \(biologist\) cannot do this/

describe('every route with an id in its path', () => {
  it('finds the routes (the sweep is not empty)', () => {
    expect(routesWithIds.length).toBeGreaterThanOrEqual(50)
    expect(routesWithIds.map(route => `${route.method} ${route.pattern}`)).toContain('GET /api/proposals/[id]')
  })

  it('answers another agency 404 exactly as for a missing id, and writes nothing', async () => {
    const before = await databaseFingerprint(server, ['sign_in_attempts'])
    const leaks: string[] = []
    for (const route of routesWithIds) {
      const target = fillPattern(route, param => idFor(route.pattern, param, ids))
      const nowhere = fillPattern(route, () => MISSING_ID)
      for (const { label, client } of outsiders) {
        const answer = await call(client, route, target)
        const missing = await call(client, route, nowhere)
        const where = `${route.method} ${target} as ${label}`
        const byRole = label.endsWith('biologist') && answer.status === 403 && ROLE_REFUSAL.test(answer.body?.message ?? '')
        if (answer.status !== 404 && !byRole) leaks.push(`${where}: ${answer.status} ${JSON.stringify(answer.body).slice(0, 160)}`)
        else if (!byRole) expectErrorAnswer(answer, 404, /not found\.$/)
        expect({ status: answer.status, body: answer.body }, `${where} differs from a missing id`).toEqual({ status: missing.status, body: missing.body })
      }
    }
    expect(leaks, 'routes that did not answer 404 to another agency').toEqual([])
    expect(await databaseFingerprint(server, ['sign_in_attempts'])).toEqual(before)
  })

  it('lets the demo agency read the same records (the ids are real)', async () => {
    for (const route of routesWithIds.filter(r => r.method === 'GET')) {
      const path = fillPattern(route, param => idFor(route.pattern, param, ids))
      const answer = await owner.get(path)
      expect(answer.status, `${path}: ${JSON.stringify(answer.body).slice(0, 200)}`).toBeLessThan(400)
    }
  })
})
