/**
 * Simulation runs end to end: POST /api/runs queues a run, the worker process (started by the
 * harness on the same database) picks it up through pg-boss, writes progress and stores a
 * result equal to the engine's own answer for the same seed; cancel; bad inputs answer 422
 * with the parameter and the engine's reason; roles and agencies.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { simulateEstablishment, simulateRescue } from '../../shared/genetics'
import { SIMULATION_ENGINE_VERSION } from '../../shared/simulation/engine-version'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword } from './auth-support'
import { createProposal, demoRecords } from './proposals-support'
import { establishmentParameters, rescueParameters, viaJson, waitForFinished, waitForRun } from './runs-support'

const server = useServer({ worker: true })

let clients: Record<'anonymous' | 'viewer' | 'biologist' | 'manager' | 'admin' | 'otherBiologist', ApiClient>
let proposalId: number
let scenarioId: number
let otherProposalId: number

async function runCount(): Promise<number> {
  const result = await server.db.query<{ count: string }>('SELECT count(*) FROM simulation_runs')
  return Number(result.rows[0]?.count ?? 0)
}

beforeAll(async () => {
  const other = await createOtherAgency(server)
  clients = {
    anonymous: server.anonymous(),
    viewer: await server.signIn(demo.viewer),
    biologist: await server.signIn(demo.biologist),
    manager: await server.signIn(demo.manager),
    admin: await server.signIn(demo.admin),
    otherBiologist: await server.signIn(other.biologistEmail, otherAgencyPassword),
  }
  const records = await demoRecords(server)
  const created = await createProposal(clients.biologist, { title: 'Simulation runs', recipientId: records.owlfeather, purpose: 'Test purpose.', sourceSubpopulationIds: [records.quillmoss] })
  proposalId = created.proposal.id
  scenarioId = created.scenarios.find((scenario: { isBaseline: boolean }) => !scenario.isBaseline).id
  const second = await createProposal(clients.manager, { title: 'Another proposal', recipientId: records.quillmoss })
  otherProposalId = second.proposal.id
})

describe('POST /api/runs → worker → result', () => {
  it('queues (202), the worker runs it, and the stored result is the engine\'s answer for that seed', async () => {
    const response = await clients.biologist.post('/api/runs', {
      proposalId, scenarioId, model: 'establishment', parameters: establishmentParameters, seed: 12345, replicates: 3000,
    })
    expect(response.status, JSON.stringify(response.body)).toBe(202)
    expect(response.body).toMatchObject({
      status: 'queued', progress: 0, seed: 12345, replicates: 3000, model: 'establishment', proposalId, scenarioId,
      engineVersion: SIMULATION_ENGINE_VERSION, parameters: establishmentParameters, result: null, attempts: 0,
      requestedBy: { name: expect.any(String) },
    })
    const id = response.body.id as number

    const done = await waitForFinished(clients.viewer, id)
    expect(done.status, done.error ?? undefined).toBe('succeeded')
    expect(done.progress).toBe(1)
    expect(done.attempts).toBe(1)
    expect(done.startedAt).toEqual(expect.any(String))
    expect(done.finishedAt).toEqual(expect.any(String))
    expect(done.result).toEqual(viaJson(simulateEstablishment(establishmentParameters, { seed: 12345, replicates: 3000 })))

    // The job itself is done in pg-boss, and the start is in the audit log.
    const job = await server.db.query<{ state: string }>(`SELECT state FROM pgboss.job WHERE id = (SELECT job_id FROM simulation_runs WHERE id = $1)`, [id])
    expect(job.rows[0]?.state).toBe('completed')
    const audit = await server.db.query(`SELECT 1 FROM audit_events WHERE action = 'simulation_run.start' AND entity_id = $1`, [id])
    expect(audit.rowCount).toBe(1)
  })

  it('rescue model: progress moves up block by block, and the result equals simulateRescue for the seed', async () => {
    const response = await clients.manager.post('/api/runs', { model: 'rescue', parameters: rescueParameters, seed: 99, replicates: 24 })
    expect(response.status, JSON.stringify(response.body)).toBe(202)
    const id = response.body.id as number
    const seen: number[] = []
    const done = await waitForRun(clients.biologist, id, (run) => {
      seen.push(run.progress)
      return run.status === 'succeeded' || run.status === 'failed'
    })
    expect(done.status, done.error ?? undefined).toBe('succeeded')
    expect(seen.some(progress => progress > 0 && progress < 1)).toBe(true)
    expect([...seen].sort((a, b) => a - b)).toEqual(seen)
    expect(done.result).toEqual(viaJson(simulateRescue(rescueParameters, { seed: 99, replicates: 24 })))
  }, 120_000)

  it('draws a seed when none is sent and returns it; that seed reproduces the result', async () => {
    const response = await clients.admin.post('/api/runs', { model: 'establishment', parameters: establishmentParameters, replicates: 500 })
    expect(response.status).toBe(202)
    const seed = response.body.seed as number
    expect(Number.isInteger(seed) && seed >= 0 && seed <= 4_294_967_295).toBe(true)
    const done = await waitForFinished(clients.admin, response.body.id)
    expect(done.result).toEqual(viaJson(simulateEstablishment(establishmentParameters, { seed, replicates: 500 })))
  })
})

describe('DELETE /api/runs/:id (cancel)', () => {
  it('cancels a running run: the worker stops, no result is stored; a second cancel is 409', async () => {
    const response = await clients.biologist.post('/api/runs', { scenarioId, model: 'rescue', parameters: rescueParameters, seed: 5, replicates: 400 })
    expect(response.status).toBe(202)
    expect(response.body.proposalId).toBe(proposalId) // found from the scenario
    const id = response.body.id as number
    await waitForRun(clients.biologist, id, run => run.status === 'running' && run.progress > 0)

    const cancelled = await clients.biologist.delete(`/api/runs/${id}`)
    expect(cancelled.status, JSON.stringify(cancelled.body)).toBe(200)
    expect(cancelled.body.status).toBe('cancelled')
    expect(cancelled.body.finishedAt).toEqual(expect.any(String))

    // The worker notices and is free again: a new run is picked up and finishes.
    const next = await clients.biologist.post('/api/runs', { model: 'establishment', parameters: establishmentParameters, seed: 1, replicates: 200 })
    expect((await waitForFinished(clients.biologist, next.body.id, 30_000)).status).toBe('succeeded')
    expect(server.worker!.output()).toMatch(new RegExp(`run ${id}: cancelled`))
    const after = await clients.viewer.get(`/api/runs/${id}`)
    expect(after.body).toMatchObject({ status: 'cancelled', result: null })

    expectErrorAnswer(await clients.biologist.delete(`/api/runs/${id}`), 409, /already been cancelled/)
    const audit = await server.db.query(`SELECT 1 FROM audit_events WHERE action = 'simulation_run.cancel' AND entity_id = $1`, [id])
    expect(audit.rowCount).toBe(1)
  }, 120_000)

  it('cancels a queued run before any worker starts it (its job is cancelled too)', async () => {
    // The worker works one run at a time: the second run waits behind the first.
    const first = await clients.manager.post('/api/runs', { model: 'rescue', parameters: rescueParameters, seed: 6, replicates: 400 })
    await waitForRun(clients.manager, first.body.id, run => run.status === 'running')
    const second = await clients.manager.post('/api/runs', { model: 'establishment', parameters: establishmentParameters, seed: 2, replicates: 100 })
    const cancelled = await clients.manager.delete(`/api/runs/${second.body.id}`)
    expect(cancelled.body.status).toBe('cancelled')
    expect((await clients.manager.delete(`/api/runs/${first.body.id}`)).status).toBe(200)
    const job = await server.db.query<{ state: string }>(`SELECT state FROM pgboss.job WHERE id = (SELECT job_id FROM simulation_runs WHERE id = $1)`, [second.body.id])
    expect(job.rows[0]?.state).toBe('cancelled')
    const third = await clients.manager.post('/api/runs', { model: 'establishment', parameters: establishmentParameters, seed: 3, replicates: 100 })
    expect((await waitForFinished(clients.manager, third.body.id, 30_000)).status).toBe('succeeded')
    const never = await clients.manager.get(`/api/runs/${second.body.id}`)
    expect(never.body).toMatchObject({ status: 'cancelled', attempts: 0, startedAt: null, result: null })
  }, 120_000)

  it('a finished run cannot be cancelled (409)', async () => {
    const response = await clients.biologist.post('/api/runs', { model: 'establishment', parameters: establishmentParameters, seed: 4, replicates: 50 })
    await waitForFinished(clients.biologist, response.body.id)
    expectErrorAnswer(await clients.biologist.delete(`/api/runs/${response.body.id}`), 409, /already succeeded/)
  })
})

describe('bad inputs → 422 with the parameter and the reason', () => {
  const establishment = (changes: Record<string, unknown>) => ({ model: 'establishment', parameters: { ...establishmentParameters, ...changes }, replicates: 10 })
  const rescue = (changes: Record<string, unknown>) => ({ model: 'rescue', parameters: { ...rescueParameters, ...changes }, replicates: 2 })
  const cases: { name: string, body: Record<string, unknown>, path: string, message: RegExp }[] = [
    { name: 'census 0 (engine)', body: establishment({ census: 0 }), path: 'parameters.census', message: /census must be an integer ≥ 1, got 0/ },
    { name: 'a census schedule entry of 2.5 (engine)', body: establishment({ census: [60, 2.5] }), path: 'parameters.census', message: /census\[\] must be an integer ≥ 1, got 2.5/ },
    { name: 's = −2 (engine)', body: establishment({ s: -2 }), path: 'parameters.s', message: /s must be > −1/ },
    { name: 'sourceFrequency 1.5 (engine)', body: establishment({ sourceFrequency: 1.5 }), path: 'parameters.sourceFrequency', message: /sourceFrequency must be in \[0, 1\], got 1.5/ },
    { name: 'generations 0 (engine)', body: establishment({ generations: 0 }), path: 'parameters.generations', message: /generations must be an integer ≥ 1, got 0/ },
    { name: 'rescue: negative events (engine)', body: rescue({ translocation: { ...rescueParameters.translocation, events: -1 } }), path: 'parameters.translocation.events', message: /translocation\.events must be an integer ≥ 0, got -1/ },
    { name: 'rescue: recipient census 1 (engine)', body: rescue({ recipient: { census: 1 } }), path: 'parameters.recipient.census', message: /recipient\.census must be an integer ≥ 2, got 1/ },
    { name: 'rescue: more migrants than the source has (engine)', body: rescue({ source: { census: 3 } }), path: 'parameters.translocation.migrantsPerEvent', message: /≤ the source census/ },
    { name: 'rescue: census above the runner\'s limit', body: rescue({ recipient: { census: 5000 } }), path: 'parameters.recipient.census', message: /at most 2,000 animals/ },
    { name: 's as text (shape)', body: establishment({ s: 'high' }), path: 'parameters.s', message: /s must be a number/ },
    { name: 'an unknown parameter (shape)', body: establishment({ mutation: 1 }), path: 'parameters', message: /mutation/ },
    { name: 'no model', body: { parameters: establishmentParameters, replicates: 10 }, path: 'model', message: /model must be one of: establishment, rescue/ },
    { name: '0 replicates', body: { ...establishment({}), replicates: 0 }, path: 'replicates', message: /at least 1 replicate/ },
    { name: 'too many replicates', body: { ...rescue({}), replicates: 5000 }, path: 'replicates', message: /at most 1,000 replicates/ },
    { name: 'too much work', body: { ...establishment({ generations: 1_000_000 }), replicates: 100_000 }, path: 'replicates', message: /replicates × generations must be at most/ },
    { name: 'a negative seed', body: { ...establishment({}), seed: -1 }, path: 'seed', message: /seed must be at least 0/ },
    { name: 'a seed above 2³² − 1', body: { ...establishment({}), seed: 4_294_967_296 }, path: 'seed', message: /seed must be at most 4294967295/ },
  ]
  for (const testCase of cases) {
    it(testCase.name, async () => {
      const before = await runCount()
      const response = await clients.biologist.post('/api/runs', testCase.body)
      expectErrorAnswer(response, 422)
      const issue = response.body.issues.find((candidate: { path: string }) => candidate.path === testCase.path)
      expect(issue, JSON.stringify(response.body.issues)).toBeDefined()
      expect(issue.message).toMatch(testCase.message)
      expect(response.body.message).toContain(testCase.path)
      expect(await runCount()).toBe(before)
    })
  }

  it('malformed JSON → 400; a scenario of another proposal → 422', async () => {
    expectErrorAnswer(await clients.biologist.request('POST', '/api/runs', '{"model":', { 'content-type': 'application/json' }), 400)
    const response = await clients.biologist.post('/api/runs', { proposalId: otherProposalId, scenarioId, ...establishment({}) })
    expectErrorAnswer(response, 422, /belongs to another proposal/)
  })
})

describe('who may do what', () => {
  let runId: number
  beforeAll(async () => {
    const response = await clients.biologist.post('/api/runs', { proposalId, model: 'establishment', parameters: establishmentParameters, seed: 8, replicates: 20 })
    runId = response.body.id
    await waitForFinished(clients.biologist, runId)
  })

  it('anonymous: 401 everywhere', async () => {
    expectErrorAnswer(await clients.anonymous.get('/api/runs'), 401)
    expectErrorAnswer(await clients.anonymous.get(`/api/runs/${runId}`), 401)
    expectErrorAnswer(await clients.anonymous.post('/api/runs', { model: 'establishment', parameters: establishmentParameters, replicates: 1 }), 401)
    expectErrorAnswer(await clients.anonymous.delete(`/api/runs/${runId}`), 401)
  })

  it('viewers read runs but cannot start or cancel them (403)', async () => {
    expect((await clients.viewer.get(`/api/runs/${runId}`)).status).toBe(200)
    expect((await clients.viewer.get(`/api/runs?proposalId=${proposalId}`)).status).toBe(200)
    const start = await clients.viewer.post('/api/runs', { model: 'establishment', parameters: establishmentParameters, replicates: 1 })
    expectErrorAnswer(start, 403)
    expect(start.body.message).toBe('Your role (viewer) cannot do this: it needs biologist, manager or administrator.')
    expectErrorAnswer(await clients.viewer.delete(`/api/runs/${runId}`), 403)
  })

  it('another agency: the run, the proposal and the scenario are 404; its own list does not show ours', async () => {
    expectErrorAnswer(await clients.otherBiologist.get(`/api/runs/${runId}`), 404, /Simulation run not found/)
    expectErrorAnswer(await clients.otherBiologist.delete(`/api/runs/${runId}`), 404)
    expectErrorAnswer(await clients.otherBiologist.post('/api/runs', { proposalId, model: 'establishment', parameters: establishmentParameters, replicates: 1 }), 404)
    expectErrorAnswer(await clients.otherBiologist.post('/api/runs', { scenarioId, model: 'establishment', parameters: establishmentParameters, replicates: 1 }), 404)
    expectErrorAnswer(await clients.otherBiologist.get(`/api/runs?proposalId=${proposalId}`), 404)
    const list = await clients.otherBiologist.get('/api/runs')
    expect(list.status).toBe(200)
    expect(list.body.items).toEqual([])
  })

  it('404 for a run that does not exist; 422 for an id that is not one', async () => {
    expectErrorAnswer(await clients.viewer.get('/api/runs/999999'), 404)
    expectErrorAnswer(await clients.viewer.get('/api/runs/abc'), 422)
  })
})

describe('GET /api/runs', () => {
  it('lists the runs of a proposal or scenario, newest first, without results', async () => {
    const byScenario = await clients.viewer.get(`/api/runs?scenarioId=${scenarioId}`)
    expect(byScenario.status).toBe(200)
    expect(byScenario.body.items.length).toBeGreaterThanOrEqual(2)
    for (const item of byScenario.body.items) {
      expect(item.scenarioId).toBe(scenarioId)
      expect(item).not.toHaveProperty('result')
    }
    const byProposal = await clients.viewer.get(`/api/runs?proposalId=${proposalId}&limit=100`)
    const ids = byProposal.body.items.map((item: { id: number }) => item.id) as number[]
    expect([...ids].sort((a, b) => b - a)).toEqual(ids)
    expect(byProposal.body.items.every((item: { proposalId: number }) => item.proposalId === proposalId)).toBe(true)
    expectErrorAnswer(await clients.viewer.get('/api/runs?limit=1000'), 422)
  })
})
