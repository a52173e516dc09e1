/**
 * Helpers for the proposal, scenario and calc API tests: the demo records by name, a valid
 * proposal body, scenario inputs, and a second agency with its own biologist.
 */
import type { ApiClient } from '../support/client'
import type { TestServer } from '../support/server'

/** Id of a demo subpopulation by name. */
export async function subpopulationId(server: TestServer, name: string): Promise<number> {
  const result = await server.db.query<{ id: number }>('SELECT id FROM subpopulations WHERE name = $1', [name])
  const row = result.rows[0]
  if (!row) throw new Error(`no subpopulation ${name}`)
  return row.id
}

/** The demo records the tests use (invented demo data, seeds/demo/subpopulations.json). */
export async function demoRecords(server: TestServer) {
  return {
    fernwhistle: await subpopulationId(server, 'Fernwhistle Creek'), // Ne 3, isolated 150 y, waterfall spray zone
    lanternmoss: await subpopulationId(server, 'Lanternmoss Gap'), // isolated 5 y, northern hardwood forest
    quillmoss: await subpopulationId(server, 'Quillmoss Ridge'), // isolated 12 y, spruce-fir summit forest
    owlfeather: await subpopulationId(server, 'Owlfeather Bald'), // isolated 120 y
  }
}

/** A scenario schedule/variant/load that passes ScenarioInputsSchema. */
export function scenarioInputs(sourceSubpopulationId: number | null, overrides: Record<string, unknown> = {}) {
  return {
    schedule: { animalsPerEvent: 6, females: 3, males: 3, intervalYears: 4, events: 2, firstEventYear: 1 },
    sourceSubpopulationId,
    variants: [{ name: 'Warm-water tolerance', sourceFrequency: 0.3, s: 0.04, sRange: [0.01, 0.08], h: 0.5, hRange: [0.2, 0.8] }],
    load: { diploidLethalEquivalents: 6, range: [3.1, 12], citation: 'custom' },
    horizonYears: 40,
    ...overrides,
  }
}

/** Creates a proposal through the API and returns its detail (fails the test otherwise). */
export async function createProposal(client: ApiClient, body: Record<string, unknown>) {
  const response = await client.post('/api/proposals', body)
  if (response.status !== 201) throw new Error(`create failed: ${response.status} ${JSON.stringify(response.body)}`)
  return response.body
}

/** Sets a proposal's status directly in the test database (with the timestamps its CHECKs need). */
export async function setProposalStatus(server: TestServer, id: number, status: string): Promise<void> {
  await server.db.query(
    `UPDATE proposals SET status = $2,
       submitted_at = CASE WHEN $2 IN ('draft', 'withdrawn') THEN submitted_at ELSE now() END,
       decided_at = CASE WHEN $2 IN ('approved', 'returned', 'declined') THEN now() ELSE decided_at END
     WHERE id = $1`,
    [id, status],
  )
}

/** Rows of a table for one proposal, counted. */
export async function countRows(server: TestServer, sql: string, params: unknown[]): Promise<number> {
  const result = await server.db.query<{ count: string }>(sql, params)
  return Number(result.rows[0]?.count ?? 0)
}
