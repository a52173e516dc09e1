/**
 * No record of another agency is reachable by guessing its id, on any route. Every route file
 * under server/api with an id in its path is read from disk (a new route is swept without being
 * listed here; one whose id the sweep cannot fill fails). For each, signed in as the
 * administrator and as the biologist of a second agency and aimed at the demo agency's record:
 * - the answer is 404 "… not found." — never the record, never 403;
 * - it is exactly the answer for an id that exists nowhere (so nothing tells the two apart);
 * - nothing is written anywhere in the database.
 * The demo agency's own administrator reads the same records (the ids are real).
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient, ApiResponse } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword } from './auth-support'
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

/** Sends the route's method with an empty JSON body for writes. */
function call(client: ApiClient, route: ApiRoute, path: string): Promise<ApiResponse> {
  return route.method === 'GET' || route.method === 'DELETE' ? client.request(route.method, path) : client.request(route.method, path, {})
}

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
        if (answer.status !== 404) leaks.push(`${where}: ${answer.status} ${JSON.stringify(answer.body).slice(0, 160)}`)
        else expectErrorAnswer(answer, 404, /not found\.$/)
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
