/**
 * The review workflow over HTTP: every transition for every role (allowed and refused), the
 * self-approval refusal, reviewer assignment, the frozen approved proposal and its revision,
 * two managers deciding at once, and bad input. Expected statuses and rules come from
 * shared/review/workflow.ts (PRODUCT.md "Review and approval"; issue 7).
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword, userId } from './auth-support'
import { addDemoUser, auditRowsOf, createDraft, createSubmitted, proposalRow } from './review-support'

const server = useServer()

let anonymous: ApiClient
let viewer: ApiClient
let biologist: ApiClient
let manager: ApiClient
let admin: ApiClient
let secondManager: ApiClient
let otherAdmin: ApiClient
const secondManagerEmail = 'second.manager@demo.tributary.test'
let secondManagerId: number

beforeAll(async () => {
  const other = await createOtherAgency(server)
  secondManagerId = await addDemoUser(server, secondManagerEmail, 'Jordan Halvorsen', 'manager')
  anonymous = server.anonymous()
  viewer = await server.signIn(demo.viewer)
  biologist = await server.signIn(demo.biologist)
  manager = await server.signIn(demo.manager)
  admin = await server.signIn(demo.admin)
  secondManager = await server.signIn(secondManagerEmail)
  otherAdmin = await server.signIn(other.adminEmail, otherAgencyPassword)
})

const decide = (client: ApiClient, id: number, decision: string, comment = 'Reasons given in full.') =>
  client.post(`/api/proposals/${id}/decision`, { decision, comment })

describe('submit', () => {
  it('only the author submits a draft: 401 anonymous, 403 viewer and other people, 404 another agency, 200 the author, 409 twice', async () => {
    const id = await createDraft(server, biologist)
    expectErrorAnswer(await anonymous.post(`/api/proposals/${id}/submit`, {}), 401)
    expectErrorAnswer(await viewer.post(`/api/proposals/${id}/submit`, {}), 403, /needs biologist, manager or administrator/)
    expectErrorAnswer(await manager.post(`/api/proposals/${id}/submit`, {}), 403, /Only the author/)
    expectErrorAnswer(await admin.post(`/api/proposals/${id}/submit`, {}), 403, /Only the author/)
    expectErrorAnswer(await otherAdmin.post(`/api/proposals/${id}/submit`, {}), 404, /Proposal not found/)
    expect((await proposalRow(server, id)).status).toBe('draft')

    const submitted = await biologist.post(`/api/proposals/${id}/submit`, {})
    expect(submitted.status).toBe(200)
    expect(submitted.body).toMatchObject({ proposalId: id, status: 'submitted', author: { name: 'Robin Okafor' }, reviewer: null })
    expect(submitted.body.allowedActions).toEqual(['withdraw'])
    const row = await proposalRow(server, id)
    expect(row.status).toBe('submitted')
    expect(row.submitted_at).not.toBeNull()
    expectErrorAnswer(await biologist.post(`/api/proposals/${id}/submit`, {}), 409, /already submitted/)
  })

  it('a submitted proposal cannot be edited (PATCH → 409)', async () => {
    const id = await createSubmitted(server, biologist)
    const { version } = await proposalRow(server, id)
    expectErrorAnswer(await biologist.patch(`/api/proposals/${id}`, { title: 'Changed', version }), 409)
  })

  it('a stale version answers 409 and changes nothing', async () => {
    const id = await createDraft(server, biologist)
    const { version } = await proposalRow(server, id)
    expectErrorAnswer(await biologist.post(`/api/proposals/${id}/submit`, { version: version + 5 }), 409, /changed after you opened it/)
    expect((await proposalRow(server, id)).status).toBe('draft')
  })

  it('a manager or administrator may submit what they wrote themselves', async () => {
    const mine = await createDraft(server, manager)
    expect((await manager.post(`/api/proposals/${mine}/submit`, {})).status).toBe(200)
    const theirs = await createDraft(server, admin)
    expect((await admin.post(`/api/proposals/${theirs}/submit`, {})).status).toBe(200)
  })
})

describe('decisions', () => {
  it('approve: 401 anonymous, 403 viewer and biologist, 404 another agency, 422 without a comment, 200 a manager, then 409 for anyone else', async () => {
    const id = await createSubmitted(server, biologist)
    expectErrorAnswer(await decide(anonymous, id, 'approve'), 401)
    expectErrorAnswer(await decide(viewer, id, 'approve'), 403, /needs manager or administrator/)
    expectErrorAnswer(await decide(biologist, id, 'approve'), 403, /needs manager or administrator/)
    expectErrorAnswer(await decide(otherAdmin, id, 'approve'), 404)
    const noComment = await decide(manager, id, 'approve', '   ')
    expectErrorAnswer(noComment, 422)
    expect(noComment.body.issues).toEqual([{ path: 'comment', message: 'Write a comment that explains the decision.' }])
    expect((await proposalRow(server, id)).status).toBe('submitted')

    const approved = await decide(manager, id, 'approve', 'Sound plan; permits first.')
    expect(approved.status).toBe(200)
    expect(approved.body).toMatchObject({ status: 'approved', latestDecision: { decision: 'approve', comment: 'Sound plan; permits first.', decidedBy: { name: 'Morgan Ellery' } } })
    expect(approved.body.monitoring.code).toBe('awaiting-translocation')
    expect((await proposalRow(server, id)).decided_at).not.toBeNull()

    for (const [client, decision] of [[admin, 'decline'], [secondManager, 'return'], [manager, 'approve']] as const) {
      expectErrorAnswer(await decide(client, id, decision), 409, /decision was already recorded/)
    }
    const decisions = await server.db.query('SELECT decision FROM decisions WHERE proposal_id = $1', [id])
    expect(decisions.rows).toEqual([{ decision: 'approve' }])
  })

  it('return → the author edits and resubmits → decline; a draft cannot be decided', async () => {
    const id = await createSubmitted(server, biologist)
    const returned = await decide(admin, id, 'return', 'Add the disease screening plan.')
    expect(returned.status).toBe(200)
    expect(returned.body.status).toBe('returned')
    expect(returned.body.allowedActions).toEqual(['reassign'])

    // The returned proposal is editable again, like a draft.
    const { version } = await proposalRow(server, id)
    const edited = await biologist.patch(`/api/proposals/${id}`, { purpose: 'Now with screening.', version })
    expect(edited.status, JSON.stringify(edited.body)).toBe(200)
    const author = await biologist.get(`/api/proposals/${id}/review`)
    expect(author.body.allowedActions).toEqual(['submit', 'withdraw'])
    expectErrorAnswer(await decide(manager, id, 'approve'), 409, /can be decided once its author submits it/)

    const again = await biologist.post(`/api/proposals/${id}/submit`, {})
    expect(again.status).toBe(200)
    expect(again.body.status).toBe('submitted')
    expect((await proposalRow(server, id)).decided_at).toBeNull()
    const declined = await decide(manager, id, 'decline', 'The source is too far.')
    expect(declined.body.status).toBe('declined')
    expect((await server.db.query('SELECT decision FROM decisions WHERE proposal_id = $1 ORDER BY id', [id])).rows.map(r => r.decision)).toEqual(['return', 'decline'])

    const draft = await createDraft(server, biologist)
    expectErrorAnswer(await decide(manager, draft, 'approve'), 409, /can be decided once its author submits it/)
  })

  it('separation of duties: nobody decides on a proposal they wrote (403), another manager may', async () => {
    const id = await createSubmitted(server, manager)
    for (const decision of ['approve', 'return', 'decline']) {
      const refused = await decide(manager, id, decision)
      expectErrorAnswer(refused, 403)
      expect(refused.body.message).toBe('You wrote this proposal, so you cannot decide on it: another manager must review it (separation of duties).')
    }
    expect(await auditRowsOf(server, 'proposal', id)).toHaveLength(2) // create + submit only
    expect((await manager.get(`/api/proposals/${id}/review`)).body).toMatchObject({ waitsForMe: false, allowedActions: ['withdraw'] })
    expect((await decide(secondManager, id, 'approve')).status).toBe(200)

    const adminsOwn = await createSubmitted(server, admin)
    expectErrorAnswer(await decide(admin, adminsOwn, 'approve'), 403, /separation of duties/)
    expect((await decide(manager, adminsOwn, 'approve')).status).toBe(200)
  })

  it('two managers deciding at once: one wins, the other gets 409 and nothing of theirs is written', async () => {
    for (let round = 0; round < 3; round++) {
      const id = await createSubmitted(server, biologist)
      const answers = await Promise.all([
        decide(manager, id, 'approve', 'Approve from the first manager.'),
        decide(secondManager, id, 'decline', 'Decline from the second manager.'),
      ])
      const statuses = answers.map(answer => answer.status).sort()
      expect(statuses).toEqual([200, 409])
      const winner = answers.find(answer => answer.status === 200)!
      const loser = answers.find(answer => answer.status === 409)!
      expect(loser.body.message).toMatch(/a decision was already recorded, so yours was not\. Reload to see it\./)
      const decisions = await server.db.query('SELECT decision, comment FROM decisions WHERE proposal_id = $1', [id])
      expect(decisions.rows).toHaveLength(1)
      expect(decisions.rows[0].decision).toBe(winner.body.latestDecision.decision)
      const audit = (await auditRowsOf(server, 'proposal', id)).filter(row => /^proposal\.(approve|return|decline)$/.test(row.action))
      expect(audit).toHaveLength(1)
      expect((await proposalRow(server, id)).status).toBe(winner.body.status)
    }
  })
})

describe('withdraw', () => {
  it('only the author withdraws a submitted proposal; then it is closed', async () => {
    const id = await createSubmitted(server, biologist)
    expectErrorAnswer(await anonymous.post(`/api/proposals/${id}/withdraw`, {}), 401)
    expectErrorAnswer(await viewer.post(`/api/proposals/${id}/withdraw`, {}), 403)
    expectErrorAnswer(await manager.post(`/api/proposals/${id}/withdraw`, {}), 403, /Only the author/)
    expectErrorAnswer(await otherAdmin.post(`/api/proposals/${id}/withdraw`, {}), 404)
    const withdrawn = await biologist.post(`/api/proposals/${id}/withdraw`, { reason: 'Source survey first.' })
    expect(withdrawn.status).toBe(200)
    expect(withdrawn.body.status).toBe('withdrawn')
    expect(withdrawn.body.allowedActions).toEqual(['revise'])
    expectErrorAnswer(await biologist.post(`/api/proposals/${id}/withdraw`, {}), 409, /only a submitted or returned proposal/)
    expectErrorAnswer(await decide(manager, id, 'approve'), 409)
    const audit = await auditRowsOf(server, 'proposal', id)
    expect(audit.at(-1)).toMatchObject({ action: 'proposal.withdraw', after: expect.objectContaining({ status: 'withdrawn', reason: 'Source survey first.' }) })

    const draft = await createDraft(server, biologist)
    expectErrorAnswer(await biologist.post(`/api/proposals/${draft}/withdraw`, {}), 409)
  })
})

describe('reviewer assignment', () => {
  it('administrators assign a reviewer; then only that reviewer (or an administrator) decides', async () => {
    const id = await createSubmitted(server, biologist)
    for (const client of [viewer, biologist, manager]) expectErrorAnswer(await client.put(`/api/proposals/${id}/reviewer`, { reviewerId: secondManagerId }), 403, /needs administrator/)
    expectErrorAnswer(await otherAdmin.put(`/api/proposals/${id}/reviewer`, { reviewerId: secondManagerId }), 404)
    const authorId = await userId(server, demo.biologist)
    const viewerId = await userId(server, demo.viewer)
    expectErrorAnswer(await admin.put(`/api/proposals/${id}/reviewer`, { reviewerId: authorId }), 422, /author cannot review/)
    expectErrorAnswer(await admin.put(`/api/proposals/${id}/reviewer`, { reviewerId: viewerId }), 422, /only managers and administrators review/)

    const assigned = await admin.put(`/api/proposals/${id}/reviewer`, { reviewerId: secondManagerId })
    expect(assigned.status).toBe(200)
    expect(assigned.body.reviewer).toEqual({ id: secondManagerId, name: 'Jordan Halvorsen' })
    expect(assigned.body.reviewerChoices.map((person: { name: string }) => person.name)).toEqual(['Avery Lindqvist', 'Jordan Halvorsen', 'Morgan Ellery'])
    expect((await proposalRow(server, id)).reviewer_id).toBe(secondManagerId)

    const refused = await decide(manager, id, 'approve')
    expectErrorAnswer(refused, 403, /assigned to Jordan Halvorsen for review/)
    expect((await manager.get(`/api/proposals/${id}/review`)).body.waitsForMe).toBe(false)
    expect((await secondManager.get(`/api/proposals/${id}/review`)).body.waitsForMe).toBe(true)
    expect((await decide(secondManager, id, 'return', 'Needs the permit list.')).status).toBe(200)

    // A closed or decided proposal keeps its reviewer.
    const approvedId = await createSubmitted(server, biologist)
    await decide(manager, approvedId, 'approve')
    expectErrorAnswer(await admin.put(`/api/proposals/${approvedId}/reviewer`, { reviewerId: secondManagerId }), 409)
  })

  it('the author may name a reviewer when submitting; an administrator may clear it', async () => {
    const id = await createDraft(server, biologist)
    const submitted = await biologist.post(`/api/proposals/${id}/submit`, { reviewerId: secondManagerId })
    expect(submitted.body.reviewer.id).toBe(secondManagerId)
    const cleared = await admin.put(`/api/proposals/${id}/reviewer`, { reviewerId: null })
    expect(cleared.body.reviewer).toBeNull()
    expect((await manager.get(`/api/proposals/${id}/review`)).body.waitsForMe).toBe(true)
  })
})

describe('approved proposals are frozen; revising starts a linked draft', () => {
  it('edits answer 409; a revision copies fields and scenarios and links back', async () => {
    const id = await createSubmitted(server, biologist, 'Frozen original')
    await decide(manager, id, 'approve')
    const { version } = await proposalRow(server, id)
    expectErrorAnswer(await biologist.patch(`/api/proposals/${id}`, { title: 'Changed', version }), 409, /approved and frozen/)
    expectErrorAnswer(await viewer.post(`/api/proposals/${id}/revise`, {}), 403)
    expectErrorAnswer(await otherAdmin.post(`/api/proposals/${id}/revise`, {}), 404)

    const revised = await manager.post(`/api/proposals/${id}/revise`, {})
    expect(revised.status).toBe(201)
    const newId = revised.body.proposalId as number
    expect(revised.body.review).toMatchObject({ status: 'draft', title: 'Frozen original (revision)', revisesId: id, author: { name: 'Morgan Ellery' } })
    const original = (await server.db.query('SELECT recipient_id, source_subpopulation_ids, purpose FROM proposals WHERE id = $1', [id])).rows[0]
    const copy = (await server.db.query('SELECT recipient_id, source_subpopulation_ids, purpose, revises_id, status, version FROM proposals WHERE id = $1', [newId])).rows[0]
    expect(copy).toMatchObject({ ...original, revises_id: id, status: 'draft', version: 0 })
    const scenarios = async (proposalId: number) => (await server.db.query('SELECT name, is_baseline, inputs FROM scenarios WHERE proposal_id = $1 ORDER BY is_baseline DESC, id', [proposalId])).rows
    expect(await scenarios(newId)).toEqual(await scenarios(id))
    expect((await proposalRow(server, id)).status).toBe('approved')
    expect((await biologist.get(`/api/proposals/${id}/review`)).body.revisions).toEqual([{ id: newId, title: 'Frozen original (revision)', status: 'draft' }])
    expectErrorAnswer(await biologist.post(`/api/proposals/${id}/revise`, {}), 409, /already open/)
    expectErrorAnswer(await biologist.post(`/api/proposals/${newId}/revise`, {}), 409, /edit this one directly/)
    expect((await auditRowsOf(server, 'proposal', id)).at(-1)).toMatchObject({ action: 'proposal.revise', after: expect.objectContaining({ revisionId: newId }) })
  })
})

describe('bad input', () => {
  it('answers 400 for malformed JSON and 422 for unknown decisions, unknown fields and bad ids', async () => {
    const id = await createSubmitted(server, biologist)
    const malformed = await manager.request('POST', `/api/proposals/${id}/decision`, '{"decision":', { 'content-type': 'application/json' })
    expectErrorAnswer(malformed, 400)
    expectErrorAnswer(await decide(manager, id, 'maybe'), 422, /approve, return or decline/)
    expectErrorAnswer(await manager.post(`/api/proposals/${id}/decision`, { decision: 'approve', comment: 'ok', extra: 1 }), 422)
    expectErrorAnswer(await manager.post(`/api/proposals/${id}/decision`, { decision: 'approve', comment: 'x'.repeat(5001) }), 422, /at most 5,000/)
    expectErrorAnswer(await manager.post('/api/proposals/abc/decision', { decision: 'approve', comment: 'ok' }), 422)
    expectErrorAnswer(await manager.post('/api/proposals/999999/decision', { decision: 'approve', comment: 'ok' }), 404)
    expectErrorAnswer(await admin.put(`/api/proposals/${id}/reviewer`, { reviewerId: 'someone' }), 422)
    expect((await proposalRow(server, id)).status).toBe('submitted')
  })
})
