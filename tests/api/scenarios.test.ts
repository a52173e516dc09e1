/**
 * Scenarios over HTTP: GET|POST /api/proposals/:id/scenarios, PATCH|DELETE /api/scenarios/:id —
 * roles (anonymous 401, viewer 403 on writes, writers allowed, another agency 404), the
 * "No action" baseline rules, sources limited to the proposal's, optimistic locking, frozen
 * proposals, audit events.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword } from './auth-support'
import { countRows, createProposal, demoRecords, scenarioInputs, setProposalStatus } from './proposals-support'

const server = useServer()

type Caller = 'anonymous' | 'viewer' | 'biologist' | 'manager' | 'administrator' | 'otherBiologist'
let clients: Record<Caller, ApiClient>
let records: Awaited<ReturnType<typeof demoRecords>>

beforeAll(async () => {
  const other = await createOtherAgency(server)
  records = await demoRecords(server)
  clients = {
    anonymous: server.anonymous(),
    viewer: await server.signIn(demo.viewer),
    biologist: await server.signIn(demo.biologist),
    manager: await server.signIn(demo.manager),
    administrator: await server.signIn(demo.admin),
    otherBiologist: await server.signIn(other.biologistEmail, otherAgencyPassword),
  }
})

async function freshDraft() {
  return createProposal(clients.biologist, { title: 'Scenario tests', recipientId: records.fernwhistle, sourceSubpopulationIds: [records.lanternmoss] })
}

describe('GET /api/proposals/:id/scenarios', () => {
  it('401 anonymous, 404 another agency, 200 for every role of the agency (baseline first)', async () => {
    const { proposal } = await freshDraft()
    const url = `/api/proposals/${proposal.id}/scenarios`
    expectErrorAnswer(await clients.anonymous.get(url), 401)
    expectErrorAnswer(await clients.otherBiologist.get(url), 404, /Proposal not found/)
    for (const role of ['viewer', 'biologist', 'manager', 'administrator'] as const) {
      const response = await clients[role].get(url)
      expect(response.status, role).toBe(200)
      expect(response.body.items.map((s: { isBaseline: boolean }) => s.isBaseline)).toEqual([true, false])
    }
  })
})

describe('POST /api/proposals/:id/scenarios', () => {
  it('401 anonymous, 403 viewer, 404 another agency, 201 for biologist, manager and administrator', async () => {
    const { proposal } = await freshDraft()
    const url = `/api/proposals/${proposal.id}/scenarios`
    const body = { name: 'Six a release', inputs: scenarioInputs(records.lanternmoss) }
    expectErrorAnswer(await clients.anonymous.post(url, body), 401)
    expectErrorAnswer(await clients.viewer.post(url, body), 403, /needs biologist, manager or administrator/)
    expectErrorAnswer(await clients.otherBiologist.post(url, body), 404, /Proposal not found/)
    for (const role of ['biologist', 'manager', 'administrator'] as const) {
      const response = await clients[role].post(url, { ...body, name: `By ${role}` })
      expect(response.status, role).toBe(201)
      expect(response.body).toMatchObject({ proposalId: proposal.id, name: `By ${role}`, isBaseline: false, version: 0 })
      expect(response.body.inputs).toEqual(body.inputs)
    }
    expect(await countRows(server, 'SELECT count(*) FROM scenarios WHERE proposal_id = $1', [proposal.id])).toBe(5)
    expect(await countRows(server, `SELECT count(*) FROM audit_events a JOIN scenarios s ON s.id = a.entity_id WHERE a.action = 'scenario.create' AND s.proposal_id = $1`, [proposal.id])).toBe(3)
  })

  it('fills the defaults (first release in year 0, 50-year horizon)', async () => {
    const { proposal } = await freshDraft()
    const inputs = scenarioInputs(null) as Record<string, unknown>
    delete inputs.horizonYears
    inputs.schedule = { animalsPerEvent: 2, females: 1, males: 1, intervalYears: 3, events: 1 }
    const response = await clients.biologist.post(`/api/proposals/${proposal.id}/scenarios`, { name: 'Defaults', inputs })
    expect(response.status).toBe(201)
    expect(response.body.inputs.horizonYears).toBe(50)
    expect(response.body.inputs.schedule.firstEventYear).toBe(0)
  })

  it('refuses a schedule-less scenario and a source that is not the proposal\'s (422)', async () => {
    const { proposal } = await freshDraft()
    const url = `/api/proposals/${proposal.id}/scenarios`
    const noSchedule = await clients.biologist.post(url, { name: 'Nothing', inputs: scenarioInputs(null, { schedule: null }) })
    expectErrorAnswer(noSchedule, 422)
    expect(noSchedule.body.issues).toEqual([{ path: 'inputs.schedule', message: 'Give a release schedule; only the "No action" baseline has none.' }])
    const otherSource = await clients.biologist.post(url, { name: 'Elsewhere', inputs: scenarioInputs(records.quillmoss) })
    expectErrorAnswer(otherSource, 422)
    expect(otherSource.body.issues[0].path).toBe('inputs.sourceSubpopulationId')
  })

  it('409 when the proposal is not editable', async () => {
    const { proposal } = await freshDraft()
    await setProposalStatus(server, proposal.id, 'approved')
    expectErrorAnswer(await clients.biologist.post(`/api/proposals/${proposal.id}/scenarios`, { name: 'Late', inputs: scenarioInputs(null) }), 409, /approved and frozen/)
  })
})

describe('PATCH /api/scenarios/:id', () => {
  it('401 anonymous, 403 viewer, 404 another agency, 200 for the writers in turn', async () => {
    const { scenarios } = await freshDraft()
    const first = scenarios[1]
    const url = `/api/scenarios/${first.id}`
    expectErrorAnswer(await clients.anonymous.patch(url, { name: 'X', version: 0 }), 401)
    expectErrorAnswer(await clients.viewer.patch(url, { name: 'X', version: 0 }), 403)
    expectErrorAnswer(await clients.otherBiologist.patch(url, { name: 'X', version: 0 }), 404, /Scenario not found/)
    expectErrorAnswer(await clients.biologist.patch('/api/scenarios/999999', { name: 'X', version: 0 }), 404, /Scenario not found/)
    let version = 0
    for (const role of ['biologist', 'manager', 'administrator'] as const) {
      const response = await clients[role].patch(url, { name: `Renamed by ${role}`, version })
      expect(response.status, role).toBe(200)
      expect(response.body.version).toBe(++version)
    }
    const audits = await countRows(server, `SELECT count(*) FROM audit_events WHERE action = 'scenario.update' AND entity_id = $1`, [first.id])
    expect(audits).toBe(3)
  })

  it('replaces the inputs; 409 for a stale version', async () => {
    const { scenarios } = await freshDraft()
    const url = `/api/scenarios/${scenarios[1].id}`
    const inputs = scenarioInputs(records.lanternmoss, { horizonYears: 80 })
    const saved = await clients.manager.patch(url, { inputs, version: 0 })
    expect(saved.status).toBe(200)
    expect(saved.body.inputs).toEqual(inputs)
    const stale = await clients.biologist.patch(url, { name: 'Too late', version: 0 })
    expectErrorAnswer(stale, 409, /since you loaded it \(you had version 0, it is now 1\)/)
    const row = await server.db.query('SELECT name, version FROM scenarios WHERE id = $1', [scenarios[1].id])
    expect(row.rows[0]).toEqual({ name: 'Scenario A', version: 1 })
  })

  it('the baseline changes only its horizon', async () => {
    const { scenarios } = await freshDraft()
    const baseline = scenarios[0]
    const url = `/api/scenarios/${baseline.id}`
    const horizon = await clients.biologist.patch(url, { inputs: { ...baseline.inputs, horizonYears: 120 }, version: 0 })
    expect(horizon.status).toBe(200)
    expect(horizon.body.inputs).toEqual({ ...baseline.inputs, horizonYears: 120 })
    expectErrorAnswer(await clients.biologist.patch(url, { name: 'Something', version: 1 }), 409, /keeps its name/)
    expectErrorAnswer(await clients.biologist.patch(url, { inputs: scenarioInputs(records.lanternmoss), version: 1 }), 409, /only its horizon can change/)
    expectErrorAnswer(await clients.biologist.patch(url, { inputs: { ...baseline.inputs, load: { ...baseline.inputs.load, diploidLethalEquivalents: 6 } }, version: 1 }), 409, /only its horizon/)
  })

  it('an ordinary scenario cannot lose its schedule; its source must stay the proposal\'s (422)', async () => {
    const { scenarios } = await freshDraft()
    const url = `/api/scenarios/${scenarios[1].id}`
    expectErrorAnswer(await clients.biologist.patch(url, { inputs: scenarioInputs(null, { schedule: null }), version: 0 }), 422, /schedule/)
    expectErrorAnswer(await clients.biologist.patch(url, { inputs: scenarioInputs(records.owlfeather), version: 0 }), 422, /not one of this proposal's sources/)
  })

  it('409 when the proposal is frozen', async () => {
    const { proposal, scenarios } = await freshDraft()
    await setProposalStatus(server, proposal.id, 'approved')
    expectErrorAnswer(await clients.biologist.patch(`/api/scenarios/${scenarios[1].id}`, { name: 'Late', version: 0 }), 409, /^This proposal is approved and frozen; start a revision to change it\.$/)
  })
})

describe('DELETE /api/scenarios/:id', () => {
  it('401 anonymous, 403 viewer, 404 another agency; a writer deletes, with an audit event', async () => {
    const { scenarios } = await freshDraft()
    const url = `/api/scenarios/${scenarios[1].id}`
    expectErrorAnswer(await clients.anonymous.delete(url), 401)
    expectErrorAnswer(await clients.viewer.delete(url), 403)
    expectErrorAnswer(await clients.otherBiologist.delete(url), 404, /Scenario not found/)
    const deleted = await clients.manager.delete(url)
    expect(deleted.status).toBe(200)
    expect(await countRows(server, 'SELECT count(*) FROM scenarios WHERE id = $1', [scenarios[1].id])).toBe(0)
    expect(await countRows(server, `SELECT count(*) FROM audit_events WHERE action = 'scenario.delete' AND entity_id = $1`, [scenarios[1].id])).toBe(1)
  })

  it('the baseline cannot be deleted; a stale version answers 409; deleting the recommended scenario clears the choice', async () => {
    const { proposal, scenarios } = await freshDraft()
    expectErrorAnswer(await clients.administrator.delete(`/api/scenarios/${scenarios[0].id}`), 409, /baseline cannot be deleted/)
    const chosen = await clients.biologist.patch(`/api/proposals/${proposal.id}`, { recommendedScenarioId: scenarios[1].id, version: 0 })
    expect(chosen.status).toBe(200)
    await clients.biologist.patch(`/api/scenarios/${scenarios[1].id}`, { name: 'Renamed', version: 0 })
    expectErrorAnswer(await clients.biologist.delete(`/api/scenarios/${scenarios[1].id}?version=0`), 409, /since you loaded it/)
    expect((await clients.biologist.delete(`/api/scenarios/${scenarios[1].id}?version=1`)).status).toBe(200)
    const after = await clients.viewer.get(`/api/proposals/${proposal.id}`)
    expect(after.body.proposal.recommendedScenarioId).toBeNull()
    expect(after.body.scenarios).toHaveLength(1)
  })

  it('409 when the proposal is not editable', async () => {
    const { proposal, scenarios } = await freshDraft()
    await setProposalStatus(server, proposal.id, 'submitted')
    expectErrorAnswer(await clients.biologist.delete(`/api/scenarios/${scenarios[1].id}`), 409, /submitted/)
  })
})
