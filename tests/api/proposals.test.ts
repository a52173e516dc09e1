/**
 * Proposals over HTTP: who may call each route (anonymous 401, viewer 403 on writes,
 * biologist / manager / administrator allowed, another agency 404), creation with the baseline
 * and the pre-filled outbreeding screen, autosave merges, optimistic locking with the "who saved
 * and when" explanation, frozen statuses, version history written in the change's transaction,
 * delete rules, and the seeded demo draft.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword } from './auth-support'
import { countRows, createProposal, demoRecords, setProposalStatus } from './proposals-support'

const server = useServer()

type Caller = 'anonymous' | 'viewer' | 'biologist' | 'manager' | 'administrator' | 'otherBiologist'
let clients: Record<Caller, ApiClient>
let records: Awaited<ReturnType<typeof demoRecords>>
let other: Awaited<ReturnType<typeof createOtherAgency>>
let names: Record<'biologist' | 'manager' | 'administrator', string>

async function userName(email: string): Promise<string> {
  const result = await server.db.query<{ name: string }>('SELECT name FROM users WHERE email = $1', [email])
  return result.rows[0]!.name // the demo users exist
}

beforeAll(async () => {
  other = await createOtherAgency(server)
  records = await demoRecords(server)
  clients = {
    anonymous: server.anonymous(),
    viewer: await server.signIn(demo.viewer),
    biologist: await server.signIn(demo.biologist),
    manager: await server.signIn(demo.manager),
    administrator: await server.signIn(demo.admin),
    otherBiologist: await server.signIn(other.biologistEmail, otherAgencyPassword),
  }
  names = { biologist: await userName(demo.biologist), manager: await userName(demo.manager), administrator: await userName(demo.admin) }
})

/** A fresh draft by the biologist: Owlfeather Bald ← Quillmoss Ridge. */
async function freshDraft(title = `Draft ${Math.random().toString(36).slice(2, 8)}`) {
  return createProposal(clients.biologist, { title, recipientId: records.owlfeather, purpose: 'Test purpose.', sourceSubpopulationIds: [records.quillmoss] })
}

describe('the seeded demo draft', () => {
  it('is a draft for the smallest, most isolated subpopulation from a large, connected one, with a baseline and cited defaults', async () => {
    const list = await clients.viewer.get('/api/proposals')
    expect(list.status).toBe(200)
    const item = list.body.items.find((p: { title: string }) => /demo draft/.test(p.title))
    expect(item).toMatchObject({ status: 'draft', recipient: { id: records.fernwhistle, name: 'Fernwhistle Creek' }, sourceSubpopulationIds: [records.lanternmoss], scenarioCount: 2, editable: true })

    const detail = await clients.viewer.get(`/api/proposals/${item.id}`)
    expect(detail.status).toBe(200)
    const { proposal, recipient, sources, scenarios, author } = detail.body
    expect(author.name).toBe(names.biologist)
    expect(recipient).toMatchObject({ name: 'Fernwhistle Creek', workingNe: 3, workingNeBasis: 'working', yearsIsolated: 150, generationTimeYears: 3.8, environmentClass: 'waterfall spray zone' })
    expect(recipient.latestCensus).toEqual({ year: 2023, adults: 12 })
    expect(sources.map((s: { name: string }) => s.name)).toEqual(['Lanternmoss Gap'])
    expect(scenarios.map((s: { name: string, isBaseline: boolean }) => [s.name, s.isBaseline])).toEqual([['No action', true], ['Scenario A', false]])
    expect(scenarios[0].inputs.schedule).toBeNull()
    expect(scenarios[1].inputs.load).toEqual({ diploidLethalEquivalents: 12, range: [3.1, 30.3], citation: 'wildMammalsAndBirdsLifeHistory' })
    expect(scenarios[1].inputs.sourceSubpopulationId).toBe(records.lanternmoss)
    expect(proposal.outbreedingAnswers).toMatchObject({
      sameSpecies: { value: true }, fixedChromosomalDifferences: { value: 'unknown' },
      geneFlowWithin500Years: { value: true }, similarEnvironments: { value: false },
    })
    expect(detail.body.lastSaved).toMatchObject({ version: 0, savedBy: { name: names.biologist } })
  })
})

describe('POST /api/proposals', () => {
  const body = () => ({ title: 'Role check', recipientId: records.owlfeather, sourceSubpopulationIds: [records.quillmoss] })

  it('401 anonymous, 403 viewer, 201 for biologist, manager and administrator', async () => {
    expectErrorAnswer(await clients.anonymous.post('/api/proposals', body()), 401)
    const refused = await clients.viewer.post('/api/proposals', body())
    expectErrorAnswer(refused, 403)
    expect(refused.body.message).toBe('Your role (viewer) cannot do this: it needs biologist, manager or administrator.')
    for (const role of ['biologist', 'manager', 'administrator'] as const) {
      const created = await clients[role].post('/api/proposals', body())
      expect(created.status, role).toBe(201)
      expect(created.body.author.name).toBe(names[role])
    }
  })

  it('creates the "No action" baseline and a first scenario, version 0 in the history and an audit event', async () => {
    const detail = await freshDraft('Baseline check')
    const id = detail.proposal.id
    expect(detail.proposal).toMatchObject({ status: 'draft', version: 0, editable: true, title: 'Baseline check', purpose: 'Test purpose.', captiveSource: null })
    expect(detail.proposal.narrative).toEqual({ rationale: '', monitoringPlan: '', risksAndMitigations: '', permitsNeeded: '', recommendationReason: '' })
    const [baseline, first] = detail.scenarios
    expect(baseline).toMatchObject({ name: 'No action', isBaseline: true, version: 0 })
    expect(baseline.inputs).toMatchObject({ schedule: null, variants: [], horizonYears: 50, load: { citation: 'wildMammalsAndBirdsLifeHistory' } })
    expect(first).toMatchObject({ name: 'Scenario A', isBaseline: false })
    expect(first.inputs.schedule).toEqual({ animalsPerEvent: 4, females: 2, males: 2, intervalYears: 5, events: 3, firstEventYear: 0 })
    expect(first.inputs.sourceSubpopulationId).toBe(records.quillmoss)
    const rows = await server.db.query('SELECT is_baseline FROM scenarios WHERE proposal_id = $1 ORDER BY id', [id])
    expect(rows.rows.map(r => r.is_baseline)).toEqual([true, false])
    const versions = await server.db.query('SELECT version, changed_fields, saved_by, snapshot FROM proposal_versions WHERE proposal_id = $1', [id])
    expect(versions.rows).toHaveLength(1)
    expect(versions.rows[0]).toMatchObject({ version: 0, changed_fields: [] })
    expect(versions.rows[0].snapshot).toEqual(detail.proposal)
    expect(await countRows(server, `SELECT count(*) FROM audit_events WHERE action = 'proposal.create' AND entity_id = $1`, [id])).toBe(1)
  })

  it('pre-fills the outbreeding screen from the records and names the record fields', async () => {
    const { proposal } = await freshDraft()
    const answers = proposal.outbreedingAnswers
    // Owlfeather Bald (120 y, grassy bald margin) ← Quillmoss Ridge (12 y, spruce-fir summit forest), same species.
    expect(answers.sameSpecies.value).toBe(true)
    expect(answers.sameSpecies.prefilledFrom).toMatch(/^species \(/)
    expect(answers.geneFlowWithin500Years.value).toBe(true)
    expect(answers.geneFlowWithin500Years.prefilledFrom).toBe('yearsIsolated (Owlfeather Bald: 120; Quillmoss Ridge: 12)')
    expect(answers.similarEnvironments.value).toBe(false)
    expect(answers.similarEnvironments.prefilledFrom).toBe('environmentClass (Owlfeather Bald: grassy bald margin; Quillmoss Ridge: spruce-fir summit forest)')
    expect(answers.fixedChromosomalDifferences).toEqual({ value: 'unknown' })
  })

  it('with only a captive source every answer from the records is "unknown"', async () => {
    const { proposal } = await createProposal(clients.manager, { title: 'Captive only', recipientId: records.owlfeather, captiveSource: 'Zoo breeding group (invented)' })
    expect(proposal.captiveSource).toBe('Zoo breeding group (invented)')
    for (const answer of Object.values(proposal.outbreedingAnswers) as { value: unknown }[]) expect(answer.value).toBe('unknown')
  })

  it('refuses a recipient or source that is not one of the agency\'s records with 422 (same words for unknown and foreign)', async () => {
    const foreign = await clients.otherBiologist.post('/api/proposals', { title: 'Foreign', recipientId: records.fernwhistle })
    expectErrorAnswer(foreign, 422)
    expect(foreign.body.issues).toEqual([{ path: 'recipientId', message: `There is no subpopulation ${records.fernwhistle} in your agency's records.` }])
    const unknown = await clients.biologist.post('/api/proposals', { title: 'Unknown', recipientId: records.fernwhistle, sourceSubpopulationIds: [999999] })
    expectErrorAnswer(unknown, 422)
    expect(unknown.body.issues).toEqual([{ path: 'sourceSubpopulationIds.0', message: 'There is no subpopulation 999999 in your agency\'s records.' }])
    const self = await clients.biologist.post('/api/proposals', { title: 'Self', recipientId: records.fernwhistle, sourceSubpopulationIds: [records.fernwhistle] })
    expectErrorAnswer(self, 422, /recipient cannot also be a source/)
  })
})

describe('GET /api/proposals and GET /api/proposals/:id', () => {
  it('every signed-in role of the agency reads; anonymous 401; another agency 404 and an empty list', async () => {
    const { proposal } = await freshDraft()
    expectErrorAnswer(await clients.anonymous.get('/api/proposals'), 401)
    expectErrorAnswer(await clients.anonymous.get(`/api/proposals/${proposal.id}`), 401)
    for (const role of ['viewer', 'biologist', 'manager', 'administrator'] as const) {
      expect((await clients[role].get(`/api/proposals/${proposal.id}`)).status, role).toBe(200)
      expect((await clients[role].get('/api/proposals')).body.items.some((p: { id: number }) => p.id === proposal.id)).toBe(true)
    }
    expectErrorAnswer(await clients.otherBiologist.get(`/api/proposals/${proposal.id}`), 404, /Proposal not found/)
    expectErrorAnswer(await clients.otherBiologist.get('/api/proposals/999999'), 404, /Proposal not found/)
    expect((await clients.otherBiologist.get('/api/proposals')).body.items).toEqual([])
  })

  it('filters by status, recipient and mine', async () => {
    const mine = await createProposal(clients.manager, { title: 'Manager draft', recipientId: records.quillmoss })
    const submitted = await freshDraft('To be submitted')
    await setProposalStatus(server, submitted.proposal.id, 'submitted')

    const ids = async (client: ApiClient, query: string) => (await client.get(`/api/proposals${query}`)).body.items.map((p: { id: number }) => p.id) as number[]
    expect(await ids(clients.viewer, '?status=submitted')).toEqual([submitted.proposal.id])
    expect(await ids(clients.viewer, `?recipientId=${records.quillmoss}`)).toContain(mine.proposal.id)
    expect(await ids(clients.viewer, `?recipientId=${records.quillmoss}`)).not.toContain(submitted.proposal.id)
    const managerOwn = await ids(clients.manager, '?mine=true')
    expect(managerOwn).toContain(mine.proposal.id)
    expect(managerOwn).not.toContain(submitted.proposal.id)
    const all = await ids(clients.manager, '?mine=false')
    expect(all).toEqual(expect.arrayContaining([mine.proposal.id, submitted.proposal.id]))
  })

  it('the detail answer is a DTO: dates as strings, no model internals', async () => {
    const detail = await clients.viewer.get(`/api/proposals/${(await freshDraft()).proposal.id}`)
    expect(typeof detail.body.proposal.createdAt).toBe('string')
    expect(Object.keys(detail.body).sort()).toEqual(['author', 'lastSaved', 'proposal', 'recipient', 'reviewer', 'scenarios', 'sources'])
    expect(JSON.stringify(detail.body)).not.toMatch(/dataValues|_previousDataValues|passwordHash/)
    expect(detail.body.recipient).toMatchObject({ name: 'Owlfeather Bald', speciesName: 'Mistridge salamander', workingNe: 6, workingNeBasis: 'working' })
  })
})

describe('PATCH /api/proposals/:id', () => {
  it('401 anonymous, 403 viewer, 404 another agency — the record untouched; biologist, manager and administrator may edit', async () => {
    const { proposal } = await freshDraft()
    const url = `/api/proposals/${proposal.id}`
    expectErrorAnswer(await clients.anonymous.patch(url, { title: 'X', version: 0 }), 401)
    expectErrorAnswer(await clients.viewer.patch(url, { title: 'X', version: 0 }), 403, /needs biologist, manager or administrator/)
    expectErrorAnswer(await clients.otherBiologist.patch(url, { title: 'X', version: 0 }), 404, /Proposal not found/)
    const untouched = await server.db.query('SELECT title, version FROM proposals WHERE id = $1', [proposal.id])
    expect(untouched.rows[0]).toMatchObject({ title: proposal.title, version: 0 })
    let version = 0
    for (const role of ['biologist', 'manager', 'administrator'] as const) {
      const response = await clients[role].patch(url, { title: `Edited by ${role}`, version })
      expect(response.status, role).toBe(200)
      expect(response.body.proposal.version).toBe(version + 1)
      version += 1
    }
  })

  it('merges narrative and checklist key by key, stores a version row and an audit event with the save', async () => {
    const { proposal } = await freshDraft()
    const url = `/api/proposals/${proposal.id}`
    const first = await clients.biologist.patch(url, { narrative: { rationale: 'Why we do it.' }, checklist: { quarantine: { done: true, note: '30 days' } }, version: 0 })
    expect(first.status).toBe(200)
    const second = await clients.manager.patch(url, { narrative: { monitoringPlan: 'Count each autumn.' }, checklist: { permits: { done: false } }, version: 1 })
    expect(second.status).toBe(200)
    expect(second.body.proposal.narrative).toMatchObject({ rationale: 'Why we do it.', monitoringPlan: 'Count each autumn.', risksAndMitigations: '' })
    expect(second.body.proposal.checklist).toEqual({ quarantine: { done: true, note: '30 days' }, permits: { done: false } })
    expect(second.body.lastSaved).toMatchObject({ version: 2, savedBy: { name: names.manager } })

    const rows = await server.db.query(
      `SELECT v.version, v.changed_fields, v.saved_by, v.snapshot, v.saved_at, p.updated_at
         FROM proposal_versions v JOIN proposals p ON p.id = v.proposal_id WHERE v.proposal_id = $1 ORDER BY v.version`, [proposal.id])
    expect(rows.rows.map(r => r.version)).toEqual([0, 1, 2])
    expect(rows.rows[1].changed_fields.sort()).toEqual(['checklist', 'narrative'])
    expect(rows.rows[2].snapshot).toEqual(second.body.proposal)
    // The snapshot is stamped with the proposal's own save time: written in the same save.
    expect(new Date(rows.rows[2].saved_at).getTime()).toBe(new Date(rows.rows[2].updated_at).getTime())
    const audits = await server.db.query(`SELECT before, after FROM audit_events WHERE action = 'proposal.update' AND entity_id = $1 ORDER BY id`, [proposal.id])
    expect(audits.rows).toHaveLength(2)
    expect(audits.rows[1].before.version).toBe(1)
    expect(audits.rows[1].after.version).toBe(2)

    const versions = await clients.viewer.get(`${url}/versions`)
    expect(versions.status).toBe(200)
    expect(versions.body.items.map((v: { version: number }) => v.version)).toEqual([2, 1, 0])
    expect(versions.body.items[0]).toMatchObject({ savedBy: { name: names.manager } })
    const one = await clients.viewer.get(`${url}/versions/1`)
    expect(one.status).toBe(200)
    expect(one.body.snapshot.narrative.rationale).toBe('Why we do it.')
    expect(one.body.snapshot.narrative.monitoringPlan).toBe('')
  })

  it('a save that changes nothing keeps the version and writes no history', async () => {
    const { proposal } = await freshDraft('Unchanged')
    const response = await clients.biologist.patch(`/api/proposals/${proposal.id}`, { title: 'Unchanged', version: 0 })
    expect(response.status).toBe(200)
    expect(response.body.proposal.version).toBe(0)
    expect(await countRows(server, 'SELECT count(*) FROM proposal_versions WHERE proposal_id = $1', [proposal.id])).toBe(1)
  })

  it('409 for a stale version, naming who saved and when; the change is not applied', async () => {
    const { proposal } = await freshDraft()
    const url = `/api/proposals/${proposal.id}`
    expect((await clients.manager.patch(url, { purpose: 'Manager was here.', version: 0 })).status).toBe(200)
    const stale = await clients.biologist.patch(url, { purpose: 'Biologist overwrites.', version: 0 })
    expectErrorAnswer(stale, 409)
    expect(stale.body.message).toMatch(new RegExp(`^Someone else saved this proposal after you opened it \\(${names.manager}, \\d{4}-\\d{2}-\\d{2} \\d{2}:\\d{2} UTC\\)\\. Reload to see their changes; your edits are still in the form\\.$`))
    const own = await clients.manager.patch(url, { purpose: 'Second tab.', version: 0 })
    expectErrorAnswer(own, 409, /by you, in another window or tab/)
    const row = await server.db.query('SELECT purpose, version FROM proposals WHERE id = $1', [proposal.id])
    expect(row.rows[0]).toEqual({ purpose: 'Manager was here.', version: 1 })
  })

  it('approved proposals are frozen; submitted, declined and withdrawn ones are not editable; returned ones are', async () => {
    const cases: [string, RegExp | null][] = [
      ['approved', /^This proposal is approved and frozen; start a revision to change it\.$/],
      ['submitted', /submitted/],
      ['declined', /declined/],
      ['withdrawn', /withdrawn/],
      ['returned', null],
    ]
    for (const [status, message] of cases) {
      const { proposal } = await freshDraft()
      await setProposalStatus(server, proposal.id, status)
      const response = await clients.manager.patch(`/api/proposals/${proposal.id}`, { title: 'Changed', version: 0 })
      if (message) {
        expectErrorAnswer(response, 409, message)
        expect((await server.db.query('SELECT title FROM proposals WHERE id = $1', [proposal.id])).rows[0].title).toBe(proposal.title)
      } else {
        expect(response.status).toBe(200)
        expect(response.body.proposal).toMatchObject({ status: 'returned', editable: true, title: 'Changed' })
      }
    }
  })

  it('an answer that differs from the records needs a reason; answers the records leave open need none', async () => {
    const { proposal } = await freshDraft()
    const url = `/api/proposals/${proposal.id}`
    const withoutReason = await clients.biologist.patch(url, { outbreedingAnswers: { similarEnvironments: { value: true } }, version: 0 })
    expectErrorAnswer(withoutReason, 422)
    expect(withoutReason.body.issues).toEqual([{ path: 'outbreedingAnswers.similarEnvironments.overrideReason', message: 'The records give "no" here; say why the answer is "yes".' }])
    const withReason = await clients.biologist.patch(url, {
      outbreedingAnswers: { similarEnvironments: { value: true, overrideReason: 'Both sites are cool, shaded and wet (field visit 2024).' }, fixedChromosomalDifferences: { value: false } },
      version: 0,
    })
    expect(withReason.status).toBe(200)
    expect(withReason.body.proposal.outbreedingAnswers.similarEnvironments).toMatchObject({ value: true, overrideReason: 'Both sites are cool, shaded and wet (field visit 2024).' })
    expect(withReason.body.proposal.outbreedingAnswers.similarEnvironments.prefilledFrom).toMatch(/^environmentClass/)
    expect(withReason.body.proposal.outbreedingAnswers.fixedChromosomalDifferences).toEqual({ value: false })
  })

  it('changing the sources re-derives the answers that followed the records and keeps overrides', async () => {
    const { proposal } = await freshDraft()
    const url = `/api/proposals/${proposal.id}`
    const overridden = await clients.biologist.patch(url, { outbreedingAnswers: { similarEnvironments: { value: true, overrideReason: 'Checked on site.' } }, version: 0 })
    expect(overridden.status).toBe(200)
    const noSources = await clients.biologist.patch(url, { sourceSubpopulationIds: [], version: 1 })
    expect(noSources.status).toBe(200)
    const answers = noSources.body.proposal.outbreedingAnswers
    expect(answers.sameSpecies).toEqual({ value: 'unknown' })
    expect(answers.geneFlowWithin500Years).toEqual({ value: 'unknown' })
    expect(answers.similarEnvironments).toEqual({ value: true })
    expect(noSources.body.sources).toEqual([])
    const back = await clients.biologist.patch(url, { sourceSubpopulationIds: [records.lanternmoss], version: 2 })
    expect(back.body.proposal.outbreedingAnswers.geneFlowWithin500Years.value).toBe(true)
    expect(back.body.sources.map((s: { name: string }) => s.name)).toEqual(['Lanternmoss Gap'])
  })

  it('checks sources and the recommended scenario against the agency and the proposal (422)', async () => {
    const a = await freshDraft()
    const b = await freshDraft()
    const url = `/api/proposals/${a.proposal.id}`
    const foreignScenario = await clients.biologist.patch(url, { recommendedScenarioId: b.scenarios[1].id, version: 0 })
    expectErrorAnswer(foreignScenario, 422)
    expect(foreignScenario.body.issues).toEqual([{ path: 'recommendedScenarioId', message: 'Choose one of this proposal\'s scenarios.' }])
    expectErrorAnswer(await clients.biologist.patch(url, { sourceSubpopulationIds: [records.owlfeather], version: 0 }), 422, /recipient cannot also be a source/)
    expectErrorAnswer(await clients.biologist.patch(url, { sourceSubpopulationIds: [999999], version: 0 }), 422, /no subpopulation 999999/)
    const chosen = await clients.biologist.patch(url, { recommendedScenarioId: a.scenarios[1].id, narrative: { recommendationReason: 'Smallest move that works.' }, version: 0 })
    expect(chosen.status).toBe(200)
    expect(chosen.body.proposal.recommendedScenarioId).toBe(a.scenarios[1].id)
    expect(chosen.body.proposal.narrative.recommendationReason).toBe('Smallest move that works.')
  })

  it('the history row and the change commit together: when the history row cannot be written nothing is saved', async () => {
    const { proposal } = await freshDraft('Atomic')
    // Occupy the version the next save would write, so its history insert fails.
    await server.db.query(`INSERT INTO proposal_versions (proposal_id, version, snapshot) VALUES ($1, 1, '{}')`, [proposal.id])
    const response = await clients.biologist.patch(`/api/proposals/${proposal.id}`, { title: 'Should not stick', version: 0 })
    expect(response.status).toBeGreaterThanOrEqual(400)
    const row = await server.db.query('SELECT title, version FROM proposals WHERE id = $1', [proposal.id])
    expect(row.rows[0]).toEqual({ title: 'Atomic', version: 0 })
    expect(await countRows(server, `SELECT count(*) FROM audit_events WHERE action = 'proposal.update' AND entity_id = $1`, [proposal.id])).toBe(0)
  })
})

describe('DELETE /api/proposals/:id', () => {
  it('401 anonymous, 403 viewer, 404 another agency, 403 for a writer who is neither author nor administrator', async () => {
    const { proposal } = await freshDraft()
    const url = `/api/proposals/${proposal.id}`
    expectErrorAnswer(await clients.anonymous.delete(url), 401)
    expectErrorAnswer(await clients.viewer.delete(url), 403)
    expectErrorAnswer(await clients.otherBiologist.delete(url), 404, /Proposal not found/)
    expectErrorAnswer(await clients.manager.delete(url), 403, /Only the author of this draft or an administrator/)
    expect(await countRows(server, 'SELECT count(*) FROM proposals WHERE id = $1', [proposal.id])).toBe(1)
  })

  it('the author deletes a draft with its scenarios and history; an audit event keeps it', async () => {
    const { proposal } = await freshDraft()
    const response = await clients.biologist.delete(`/api/proposals/${proposal.id}`)
    expect(response.status).toBe(200)
    expect(response.body.message).toMatch(/was deleted/)
    for (const table of ['proposals WHERE id', 'scenarios WHERE proposal_id', 'proposal_versions WHERE proposal_id']) {
      expect(await countRows(server, `SELECT count(*) FROM ${table} = $1`, [proposal.id]), table).toBe(0)
    }
    const audit = await server.db.query(`SELECT before FROM audit_events WHERE action = 'proposal.delete' AND entity_id = $1`, [proposal.id])
    expect(audit.rows[0].before.title).toBe(proposal.title)
    expect(audit.rows[0].before.scenarios).toHaveLength(2)
    expectErrorAnswer(await clients.biologist.get(`/api/proposals/${proposal.id}`), 404)
  })

  it('an administrator may delete anyone\'s draft; only drafts can be deleted; a stale version answers 409', async () => {
    const first = await freshDraft()
    expect((await clients.administrator.delete(`/api/proposals/${first.proposal.id}`)).status).toBe(200)
    for (const status of ['submitted', 'approved', 'returned', 'withdrawn']) {
      const { proposal } = await freshDraft()
      await setProposalStatus(server, proposal.id, status)
      expectErrorAnswer(await clients.administrator.delete(`/api/proposals/${proposal.id}`), 409, new RegExp(`Only drafts can be deleted; this proposal is ${status}`))
    }
    const edited = await freshDraft()
    await clients.biologist.patch(`/api/proposals/${edited.proposal.id}`, { title: 'Edited', version: 0 })
    expectErrorAnswer(await clients.biologist.delete(`/api/proposals/${edited.proposal.id}?version=0`), 409, /Someone else saved|saved again/)
    expect((await clients.biologist.delete(`/api/proposals/${edited.proposal.id}?version=1`)).status).toBe(200)
  })
})

describe('version history routes', () => {
  it('401 anonymous, 404 another agency or an unknown version, 200 for the agency\'s viewer', async () => {
    const { proposal } = await freshDraft()
    const url = `/api/proposals/${proposal.id}/versions`
    expectErrorAnswer(await clients.anonymous.get(url), 401)
    expectErrorAnswer(await clients.anonymous.get(`${url}/0`), 401)
    expectErrorAnswer(await clients.otherBiologist.get(url), 404, /Proposal not found/)
    expectErrorAnswer(await clients.otherBiologist.get(`${url}/0`), 404, /Proposal not found/)
    expectErrorAnswer(await clients.viewer.get(`${url}/7`), 404, /Version 7 of this proposal not found/)
    const list = await clients.viewer.get(url)
    expect(list.body.items).toEqual([{ version: 0, savedBy: { id: expect.any(Number), name: names.biologist }, savedAt: expect.any(String), changedFields: [] }])
    const zero = await clients.viewer.get(`${url}/0`)
    expect(zero.body.snapshot).toMatchObject({ id: proposal.id, version: 0, title: proposal.title })
  })
})
