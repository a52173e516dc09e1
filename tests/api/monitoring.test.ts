/**
 * Monitoring after approval over HTTP: recording translocations and follow-ups (who may, on
 * which proposals, what is refused), the monitoring status as records accumulate, and the
 * observed-against-projected course. Projected values are checked against Wright's island-model
 * step computed by hand here (SCIENCE.md eq. 4.1–4.2: F_t = (1 − m)²·[1/(2Ne) + (1 − 1/(2Ne))·F_(t−1)],
 * m = a / (N + a)), independently of the engine's code.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword } from './auth-support'
import { auditRowsOf, createDraft, createSubmitted, subpopulationId } from './review-support'

const server = useServer()

let anonymous: ApiClient
let viewer: ApiClient
let biologist: ApiClient
let manager: ApiClient
let otherAdmin: ApiClient
let otherAgencySubpopulation: number
let approvedId: number
let recipient: number
let source: number

const today = () => new Date().toISOString().slice(0, 10)
const daysAgo = (days: number) => new Date(Date.now() - days * 86_400_000).toISOString().slice(0, 10)

const move = (overrides: Record<string, unknown> = {}) => ({
  movedOn: daysAgo(10),
  sourceId: source,
  animals: [{ id: 'LG-1', sex: 'female' }, { id: 'LG-2', sex: 'male' }, { id: 'LG-3', sex: 'unknown' }],
  notes: 'Released at dusk.',
  ...overrides,
})

async function approvedProposal(title?: string): Promise<number> {
  const id = await createSubmitted(server, biologist, title)
  expect((await manager.post(`/api/proposals/${id}/decision`, { decision: 'approve', comment: 'Approved for monitoring tests.' })).status).toBe(200)
  return id
}

beforeAll(async () => {
  const other = await createOtherAgency(server)
  anonymous = server.anonymous()
  viewer = await server.signIn(demo.viewer)
  biologist = await server.signIn(demo.biologist)
  manager = await server.signIn(demo.manager)
  otherAdmin = await server.signIn(other.adminEmail, otherAgencyPassword)
  recipient = await subpopulationId(server, 'Cinderbrook Cove')
  source = await subpopulationId(server, 'Lanternmoss Gap')
  const species = await server.db.query(`INSERT INTO species (agency_id, common_name, scientific_name) VALUES ($1, 'Other newt', 'Alius tritonus') RETURNING id`, [other.agencyId])
  otherAgencySubpopulation = (await server.db.query(
    `INSERT INTO subpopulations (agency_id, species_id, name, generation_time_years) VALUES ($1, $2, 'Elsewhere Pond', 3) RETURNING id`,
    [other.agencyId, species.rows[0].id],
  )).rows[0].id
  approvedId = await approvedProposal('Monitored')
})

describe('POST /api/proposals/:id/translocations', () => {
  it('biologists, managers and administrators record moves on approved proposals; others are refused', async () => {
    expectErrorAnswer(await anonymous.post(`/api/proposals/${approvedId}/translocations`, move()), 401)
    expectErrorAnswer(await viewer.post(`/api/proposals/${approvedId}/translocations`, move()), 403, /needs biologist, manager or administrator/)
    expectErrorAnswer(await otherAdmin.post(`/api/proposals/${approvedId}/translocations`, move()), 404)
    const draft = await createDraft(server, biologist)
    expectErrorAnswer(await biologist.post(`/api/proposals/${draft}/translocations`, move()), 409, /once the proposal is approved; this one is draft/)
    const submitted = await createSubmitted(server, biologist)
    expectErrorAnswer(await biologist.post(`/api/proposals/${submitted}/translocations`, move()), 409)

    const recorded = await biologist.post(`/api/proposals/${approvedId}/translocations`, move())
    expect(recorded.status, JSON.stringify(recorded.body)).toBe(201)
    expect(recorded.body).toMatchObject({
      proposalId: approvedId, movedOn: daysAgo(10), source: { id: source, name: 'Lanternmoss Gap' }, recipient: { id: recipient, name: 'Cinderbrook Cove' },
      females: 1, males: 1, unknownSex: 1, recordedBy: { name: 'Robin Okafor' }, notes: 'Released at dusk.',
    })
    expect(recorded.body.animals).toEqual(move().animals)
    const audit = await auditRowsOf(server, 'translocation', recorded.body.id)
    expect(audit).toHaveLength(1)
    expect(audit[0]).toMatchObject({ action: 'translocation.create', after: expect.objectContaining({ proposalId: approvedId }) })

    const captive = await manager.post(`/api/proposals/${approvedId}/translocations`, move({ sourceId: null, sourceNote: 'Ridgeford captive colony (invented)', animals: [{ id: 'C-9', sex: 'male' }] }))
    expect(captive.status).toBe(201)
    expect(captive.body).toMatchObject({ source: null, sourceNote: 'Ridgeford captive colony (invented)' })

    const list = await viewer.get(`/api/proposals/${approvedId}/translocations`)
    expect(list.body.items.map((item: { id: number }) => item.id).sort()).toEqual([recorded.body.id, captive.body.id].sort())
    expectErrorAnswer(await otherAdmin.get(`/api/proposals/${approvedId}/translocations`), 404)
  })

  it('refuses bad moves with 422 and a reason per field, writing nothing', async () => {
    const before = (await server.db.query('SELECT count(*)::int AS n FROM translocations')).rows[0].n
    const cases: [Record<string, unknown>, string, RegExp][] = [
      [{ animals: [] }, 'animals', /at least one animal/],
      [{ animals: [{ id: 'A', sex: 'female' }, { id: 'a', sex: 'male' }] }, 'animals.1.id', /listed twice/],
      [{ animals: [{ id: 'A', sex: 'juvenile' }] }, 'animals.0.sex', /female, male or unknown/],
      [{ animals: [{ id: '  ', sex: 'male' }] }, 'animals.0.id', /id/],
      [{ sourceId: null, sourceNote: '' }, 'sourceNote', /Name the captive/],
      [{ sourceId: recipient }, 'sourceId', /cannot be the recipient/],
      [{ sourceId: otherAgencySubpopulation }, 'sourceId', /no subpopulation/],
      [{ recipientId: otherAgencySubpopulation }, 'recipientId', /no subpopulation/],
      [{ movedOn: '2025-02-30' }, 'movedOn', /real date/],
      [{ movedOn: '2999-01-01' }, 'movedOn', /between 1900 and 2200/],
      [{ movedOn: new Date(Date.now() + 5 * 86_400_000).toISOString().slice(0, 10) }, 'movedOn', /cannot be in the future/],
      [{ extra: true }, '', /extra/i],
    ]
    for (const [overrides, path, message] of cases) {
      const response = await biologist.post(`/api/proposals/${approvedId}/translocations`, move(overrides))
      expectErrorAnswer(response, 422)
      const issue = (response.body.issues ?? []).find((entry: { path: string }) => entry.path === path)
      expect(issue?.message ?? response.body.message, JSON.stringify(overrides)).toMatch(message)
    }
    expect((await server.db.query('SELECT count(*)::int AS n FROM translocations')).rows[0].n).toBe(before)
  })
})

describe('POST /api/proposals/:id/observations', () => {
  it('records follow-ups with at least one figure; viewers are refused', async () => {
    const body = { observedOn: daysAgo(2), census: 70, heterozygosity: 0.61, inbreeding: 0.04, source: 'Autumn count and genotyping (test)' }
    expectErrorAnswer(await viewer.post(`/api/proposals/${approvedId}/observations`, body), 403)
    expectErrorAnswer(await otherAdmin.post(`/api/proposals/${approvedId}/observations`, body), 404)
    expectErrorAnswer(await biologist.post(`/api/proposals/${approvedId}/observations`, { observedOn: daysAgo(2), source: 'x' }), 422, /at least one figure/)
    expectErrorAnswer(await biologist.post(`/api/proposals/${approvedId}/observations`, { ...body, heterozygosity: 1.2 }), 422, /0 to 1/)
    expectErrorAnswer(await biologist.post(`/api/proposals/${approvedId}/observations`, { ...body, inbreeding: -1 }), 422, /between −1 and 1/)
    expectErrorAnswer(await biologist.post(`/api/proposals/${approvedId}/observations`, { ...body, census: 2.5 }), 422, /whole number/)
    expectErrorAnswer(await biologist.post(`/api/proposals/${approvedId}/observations`, { ...body, source: ' ' }), 422, /where the figures come from/)
    const recorded = await biologist.post(`/api/proposals/${approvedId}/observations`, body)
    expect(recorded.status).toBe(201)
    expect(recorded.body).toMatchObject({ ...body, proposalId: approvedId, subpopulationId: recipient, recordedBy: { name: 'Robin Okafor' } })
    const onlyCensus = await manager.post(`/api/proposals/${approvedId}/observations`, { observedOn: daysAgo(1), census: 72, source: 'Spot count' })
    expect(onlyCensus.body).toMatchObject({ census: 72, heterozygosity: null, inbreeding: null })
  })
})

describe('GET /api/proposals/:id/monitoring', () => {
  it('before approval: not started, nothing to record, no projection', async () => {
    const draft = await createDraft(server, biologist)
    const response = await biologist.get(`/api/proposals/${draft}/monitoring`)
    expect(response.status).toBe(200)
    expect(response.body).toMatchObject({ proposalStatus: 'draft', status: { code: 'not-applicable' }, translocations: [], observations: [], projection: null, canRecord: false })
    expectErrorAnswer(await anonymous.get(`/api/proposals/${draft}/monitoring`), 401)
    expectErrorAnswer(await otherAdmin.get(`/api/proposals/${draft}/monitoring`), 404)
  })

  it('the status follows what is recorded: awaiting translocation → awaiting follow-up → monitored; follow-up due after a year', async () => {
    const id = await approvedProposal('Status course')
    const status = async () => (await viewer.get(`/api/proposals/${id}/monitoring`)).body.status
    expect(await status()).toMatchObject({ code: 'awaiting-translocation', label: 'Awaiting translocation' })
    await biologist.post(`/api/proposals/${id}/translocations`, move({ movedOn: daysAgo(400) }))
    expect(await status()).toMatchObject({ code: 'follow-up-due' })
    await biologist.post(`/api/proposals/${id}/observations`, { observedOn: daysAgo(30), census: 60, source: 'Count' })
    expect(await status()).toMatchObject({ code: 'monitored', nextDueOn: new Date(Date.now() + 335 * 86_400_000).toISOString().slice(0, 10) })
    await biologist.post(`/api/proposals/${id}/translocations`, move({ movedOn: daysAgo(5) }))
    expect(await status()).toMatchObject({ code: 'awaiting-follow-up' })
    const review = await viewer.get(`/api/proposals/${id}/review`)
    expect(review.body.monitoring.code).toBe('awaiting-follow-up')
  })

  it('compares observed with the projection computed from the releases planned and made', async () => {
    const response = await viewer.get(`/api/proposals/${approvedId}/monitoring`)
    expect(response.status).toBe(200)
    const body = response.body
    expect(body.canRecord).toBe(false) // viewer
    expect((await biologist.get(`/api/proposals/${approvedId}/monitoring`)).body.canRecord).toBe(true)
    expect(body.sources).toEqual([{ id: source, name: 'Lanternmoss Gap' }])
    const projection = body.projection
    expect(projection).not.toBeNull()
    expect(projection.startOn).toBe(daysAgo(10)) // the first move
    expect(projection.startKind).toBe('first-translocation')
    expect(projection.heterozygosityScale).toBe('absolute')
    expect(projection.basis.initialHeterozygosity).toBe(0.61)

    // Recipient figures from the record: census of the decision year's latest count, working Ne, generation time.
    const record = (await server.db.query(
      `SELECT s.working_ne, s.generation_time_years, (SELECT adults FROM census_counts c WHERE c.subpopulation_id = s.id AND c.year <= $2 ORDER BY year DESC LIMIT 1) AS census
         FROM subpopulations s WHERE s.id = $1`, [recipient, new Date().getUTCFullYear()],
    )).rows[0]
    expect(projection.basis).toMatchObject({ census: record.census, effectiveSize: record.working_ne, generationTimeYears: record.generation_time_years, initialInbreeding: 0 })

    // Generation 1 by hand: no action → 1/(2Ne); moves made: 3 + 1 animals in the first generation.
    const Ne = record.working_ne as number
    const N = record.census as number
    const drift = 1 / (2 * Ne)
    const made = 4 // both moves of the first test, 10 days ago
    const m = made / (N + made)
    const first = projection.points[1]
    expect(first.generation).toBe(1)
    expect(first.noAction.inbreeding).toBeCloseTo(drift, 12)
    expect(first.actual.inbreeding).toBeCloseTo((1 - m) ** 2 * drift, 12)
    expect(first.actual.heterozygosity).toBeCloseTo(0.61 * (1 - (1 - m) ** 2 * drift), 12)
    // Planned: the default scenario schedule (4 animals at year 0) — the same first step here.
    expect(first.planned.inbreeding).toBeCloseTo((1 - 4 / (N + 4)) ** 2 * drift, 12)
    // Generation 2 without releases in it: one more drift step from generation 1.
    const second = projection.points[2]
    expect(second.noAction.inbreeding).toBeCloseTo(drift + (1 - drift) * drift, 12)
    expect(second.actual.inbreeding).toBeCloseTo(drift + (1 - drift) * first.actual.inbreeding, 12)

    expect(projection.observed.map((point: { observedOn: string }) => point.observedOn)).toEqual([daysAgo(2), daysAgo(1)])
    expect(projection.actualReleases.map((release: { animals: number }) => release.animals)).toEqual([3, 1])
    expect(projection.notes.join(' ')).toMatch(/unrelated to the recipient/)
    expect(body.observations).toHaveLength(2)
    expect(body.translocations).toHaveLength(2)
  })

  it('shows the demo approved proposal with its seeded monitoring', async () => {
    const demoId = (await server.db.query(`SELECT id FROM proposals WHERE title = 'Gene flow for Owlfeather Bald (demo, approved)'`)).rows[0].id
    const body = (await viewer.get(`/api/proposals/${demoId}/monitoring`)).body
    expect(body.status.code).toBe('monitored')
    expect(body.translocations[0]).toMatchObject({ source: { name: 'Quillmoss Ridge' }, recipient: { name: 'Owlfeather Bald' }, females: 3, males: 3 })
    expect(body.projection.scenario.name).toBe('Six adults every seven years')
    // F0 = 0.22 from the scenario's override; Ne 6: no action after one generation = 1/12 + (11/12)·0.22.
    expect(body.projection.points[1].noAction.inbreeding).toBeCloseTo(1 / 12 + (11 / 12) * 0.22, 12)
    expect(today() >= body.projection.startOn).toBe(true)
  })
})
