/**
 * Hostile input on every API route, found by scanning server/api (fuzz-routes.ts): 200
 * generated requests per route with fast-check and a fixed seed per route, each with its own
 * address parameters (real ids and anything but), query string and body (JSON of every wrong
 * shape, or multipart uploads with tricky names and contents; see fuzz-inputs.ts).
 *
 * Each route is called as someone who may call it (found by asking anonymously, then each role
 * from administrator down, with an address that fails validation), so the requests reach the
 * validation and the rules behind it rather than stopping at 401/403. Before fuzzing, the route
 * is sent `{}` (and `{}` in each field it names) to learn its field names from the 422 issues.
 *
 * Every answer: no 5xx; errors in JSON with a sentence for a person and nothing internal
 * (fuzz-http.ts). Every refused request (4xx): no committed row change in any table
 * (fuzz-writes.ts), except the sign-in attempts the rate limiter records on purpose and the
 * Outbox dispatcher marking mail sent in the background.
 */
import fc from 'fast-check'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { answerProblems, closeRawConnections, sendRaw, type RawAnswer } from './fuzz-http'
import { learnBody } from './fuzz-learn'
import { jsonBody, multipartBody, paramValue, queryString, type FuzzCase, type RouteKnowledge } from './fuzz-inputs'
import { discoverApiRoutes, endsSessions, recordTableOf, type ApiRoute } from './fuzz-routes'
import { installWriteWatch, type RowWrite, type WriteWatch } from './fuzz-writes'

const RUNS_PER_ROUTE = 200
const BASE_SEED = 20_261_202
const ROLES = ['administrator', 'manager', 'biologist', 'viewer'] as const
type Caller = 'anonymous' | typeof ROLES[number]

const server = useServer()
let cookies: Record<Caller, string>
let watch: WriteWatch
let mark = 0
const started = Date.now()
const tally: string[] = []

const routes = discoverApiRoutes()
const ordered = [...routes.filter(route => !endsSessions(route)), ...routes.filter(endsSessions)]

beforeAll(async () => {
  const signedIn: Record<string, ApiClient> = {}
  for (const role of ROLES) signedIn[role] = await server.signIn(demo[role === 'administrator' ? 'admin' : role])
  cookies = { anonymous: '', ...Object.fromEntries(ROLES.map(role => [role, signedIn[role]!.cookieHeader])) } as Record<Caller, string>
  watch = await installWriteWatch(server.db)
  mark = await watch.mark()
})

afterAll(() => {
  closeRawConnections()
  console.info(`[fuzz] ${routes.length} routes × ${RUNS_PER_ROUTE} requests in ${Math.round((Date.now() - started) / 1000)} s\n${tally.join('\n')}`)
})

/** Writes a refused request may cause: failed sign-ins are counted on purpose; the Outbox dispatcher runs on its own. */
function writeIsExpected(write: RowWrite): boolean {
  return write.table === 'sign_in_attempts' || (write.table === 'outbox_messages' && write.operation === 'UPDATE')
}

/** Seed of one route's generator: fixed, and independent of the other routes. */
function seedOf(route: ApiRoute): number {
  let hash = BASE_SEED
  for (const char of `${route.method} ${route.template}`) hash = (Math.imul(hash, 31) + char.charCodeAt(0)) | 0
  return hash
}

function pathOf(route: ApiRoute, params: Record<string, string>, query = ''): string {
  return `${route.template.replace(/\[([^\]]+)\]/g, (_, name: string) => params[name] ?? '1')}${query}`
}

async function send(route: ApiRoute, caller: Caller, path: string, body?: FuzzCase['body']): Promise<RawAnswer> {
  const headers: Record<string, string> = { accept: 'application/json' }
  if (cookies[caller]) headers.cookie = cookies[caller]
  if (body?.contentType) headers['content-type'] = body.contentType
  return sendRaw(server.url, { method: route.method, path, headers, body: body?.bytes })
}

const jsonOf = (value: unknown): FuzzCase['body'] => ({ contentType: 'application/json', bytes: Buffer.from(JSON.stringify(value)), label: 'probe' })
const hasBody = (route: ApiRoute) => ['POST', 'PUT', 'PATCH'].includes(route.method)

/** Real ids (as text) for each parameter of the route, read now (earlier routes may have deleted some). */
async function realIdsOf(route: ApiRoute): Promise<Record<string, string[]>> {
  const ids: Record<string, string[]> = {}
  for (const param of route.params) {
    const table = recordTableOf(route, param)
    if (table) ids[param] = (await server.db.query<{ id: string }>(`SELECT id::text AS id FROM "${table}" ORDER BY id LIMIT 40`)).rows.map(row => row.id)
    else if (param === 'version') ids[param] = ['0', '1', '2']
    else ids[param] = []
  }
  return ids
}

/** The first caller, anonymous then roles from most to least powerful, that gets past the sign-in and role checks. */
async function callerOf(route: ApiRoute): Promise<{ caller: Caller, probes: RawAnswer[] }> {
  const badParams = Object.fromEntries(route.params.map(param => [param, 'not-a-record']))
  const probes: RawAnswer[] = []
  for (const caller of ['anonymous', ...ROLES] as Caller[]) {
    const answer = await send(route, caller, pathOf(route, badParams), hasBody(route) ? jsonOf({}) : undefined)
    probes.push(answer)
    if (answer.status !== 401 && answer.status !== 403) return { caller, probes }
  }
  throw new Error(`No caller gets past the sign-in and role checks of ${route.method} ${route.template}: ${probes.map(p => p.status).join(', ')}`)
}

function requestArbitrary(route: ApiRoute, knowledge: RouteKnowledge): fc.Arbitrary<FuzzCase> {
  const params = fc.record(Object.fromEntries(route.params.map(param => [param, paramValue(knowledge.realIds[param] ?? [])])) as Record<string, fc.Arbitrary<string>>)
  let body: fc.Arbitrary<FuzzCase['body']>
  if (!hasBody(route)) body = fc.oneof({ arbitrary: fc.constant(undefined), weight: 9 }, { arbitrary: jsonBody(knowledge), weight: 1 })
  else if (knowledge.multipart) body = fc.oneof({ arbitrary: multipartBody(knowledge.fields), weight: 9 }, { arbitrary: jsonBody(knowledge), weight: 1 })
  else body = fc.oneof({ arbitrary: jsonBody(knowledge), weight: 9 }, { arbitrary: multipartBody(knowledge.fields), weight: 1 })
  return fc.record({ params, query: queryString, body })
}

function describeCase(route: ApiRoute, path: string, request: FuzzCase): string {
  const body = request.body ? `${request.body.label}, ${request.body.contentType ?? 'no content type'}: ${request.body.bytes.subarray(0, 300).toString('utf8')}` : 'no body'
  return `${route.method} ${path.slice(0, 400)} — ${body}`
}

describe('every API route under hostile input', () => {
  it('finds the routes by scanning server/api', () => {
    expect(routes.length).toBeGreaterThan(50)
    expect(routes).toContainEqual(expect.objectContaining({ method: 'PATCH', template: '/api/subpopulations/[id]', params: ['id'] }))
    expect(routes).toContainEqual(expect.objectContaining({ method: 'GET', template: '/api/proposals/[id]/versions/[version]', params: ['id', 'version'] }))
  })

  it('the write watch sees committed row changes and not rolled-back ones', async () => {
    const before = await watch.mark()
    const client = await server.db.connect()
    try {
      await client.query('BEGIN')
      await client.query('UPDATE agencies SET name = name')
      await client.query('ROLLBACK')
    } finally {
      client.release()
    }
    expect((await watch.since(before)).writes).toEqual([])
    await server.db.query('UPDATE agencies SET name = name WHERE id = (SELECT min(id) FROM agencies)')
    const { writes, next } = await watch.since(before)
    expect(writes).toEqual([{ table: 'agencies', operation: 'UPDATE' }])
    mark = next
  })

  it.each(ordered.map(route => [`${route.method} ${route.template}`, route] as const))('%s', async (_name, route) => {
    const { caller, probes } = await callerOf(route)
    const realIds = await realIdsOf(route)
    const probeParams = Object.fromEntries(route.params.map(param => [param, realIds[param]?.[0] ?? '1']))
    const learned = hasBody(route)
      ? await learnBody(body => send(route, caller, pathOf(route, probeParams), jsonOf(body)))
      : { fields: [], example: {}, accepted: false, multipart: false, probes: [] }
    for (const probe of [...probes, ...learned.probes]) expect(answerProblems(probe), probe.text).toEqual([])
    ;({ next: mark } = await watch.since(mark))

    const statuses = new Map<number, number>()
    const timing = { send: 0, watch: 0 }
    const knowledge: RouteKnowledge = { realIds, fields: learned.fields, multipart: learned.multipart, example: learned.example }
    await fc.assert(fc.asyncProperty(requestArbitrary(route, knowledge), async (request) => {
      const path = pathOf(route, request.params, request.query)
      const sentAt = performance.now()
      const answer = await send(route, caller, path, request.body)
      const answeredAt = performance.now()
      timing.send += Math.round(answeredAt - sentAt)
      statuses.set(answer.status, (statuses.get(answer.status) ?? 0) + 1)
      const { writes, next } = await watch.since(mark)
      mark = next
      timing.watch += Math.round(performance.now() - answeredAt)
      const problems = answerProblems(answer)
      const unexpected = writes.filter(write => !writeIsExpected(write))
      if (answer.status >= 400 && unexpected.length > 0) problems.push(`refused with ${answer.status} but wrote ${unexpected.map(w => `${w.operation} ${w.table}`).join(', ')}`)
      if (caller !== 'anonymous' && answer.status === 401 && !endsSessions(route)) problems.push('the signed-in caller was answered 401 (session lost?)')
      if (problems.length > 0) throw new Error(`${problems.join('; ')}\n${describeCase(route, path, request)}\nanswer ${answer.status}: ${answer.text.slice(0, 300)}`)
    }), { seed: seedOf(route), numRuns: RUNS_PER_ROUTE, endOnFailure: true })

    const summary = [...statuses].sort(([a], [b]) => a - b).map(([status, count]) => `${status}×${count}`).join(' ')
    tally.push(`${route.method.padEnd(6)} ${route.template.padEnd(58)} as ${caller.padEnd(13)} fields ${String(learned.fields.length).padStart(2)}${learned.accepted ? ' (valid body learned)' : ''} | ${summary} | ${timing.send} ms HTTP, ${timing.watch} ms write checks`)
    // The calls must reach validation: not every answer may be the same refusal at the door.
    expect([...statuses.keys()].some(status => status !== 401 && status !== 403)).toBe(true)
  }, 120_000)
})
