/**
 * Comments with mentions, the proposal timeline and the Reviews inbox over HTTP: every role
 * comments (viewers too), mentions by @address and by id e-mail the mentioned, the timeline
 * lists who did what and when in order, the inbox shows what waits for whom and for how long.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword, userId } from './auth-support'
import { addDemoUser, createDraft, createSubmitted, mailTo, waitForMail } from './review-support'

const server = useServer()

let anonymous: ApiClient
let viewer: ApiClient
let biologist: ApiClient
let manager: ApiClient
let admin: ApiClient
let otherAdmin: ApiClient
let otherBiologistId: number

beforeAll(async () => {
  const other = await createOtherAgency(server)
  otherBiologistId = other.biologistId
  anonymous = server.anonymous()
  viewer = await server.signIn(demo.viewer)
  biologist = await server.signIn(demo.biologist)
  manager = await server.signIn(demo.manager)
  admin = await server.signIn(demo.admin)
  otherAdmin = await server.signIn(other.adminEmail, otherAgencyPassword)
})

describe('comments', () => {
  it('every role of the agency comments and reads comments; 401 anonymous, 404 another agency', async () => {
    const id = await createSubmitted(server, biologist)
    expectErrorAnswer(await anonymous.post(`/api/proposals/${id}/comments`, { body: 'Hello' }), 401)
    expectErrorAnswer(await otherAdmin.post(`/api/proposals/${id}/comments`, { body: 'Hello' }), 404)
    expectErrorAnswer(await otherAdmin.get(`/api/proposals/${id}/comments`), 404)
    const commenters = [[viewer, 'Viewer question.', 'Sasha Whitfield'], [biologist, 'Biologist answer.', 'Robin Okafor'], [manager, 'Manager note.', 'Morgan Ellery'], [admin, 'Admin note.', 'Avery Lindqvist']] as const
    for (const [client, body, name] of commenters) {
      const posted = await client.post(`/api/proposals/${id}/comments`, { body })
      expect(posted.status, JSON.stringify(posted.body)).toBe(201)
      expect(posted.body).toMatchObject({ proposalId: id, body, mentions: [], author: { name } })
    }
    const list = await viewer.get(`/api/proposals/${id}/comments`)
    expect(list.body.items.map((c: { body: string, author: { name: string } }) => `${c.author.name}: ${c.body}`)).toEqual([
      'Sasha Whitfield: Viewer question.', 'Robin Okafor: Biologist answer.', 'Morgan Ellery: Manager note.', 'Avery Lindqvist: Admin note.',
    ])
  })

  it('comments are allowed at any status, also on an approved (frozen) proposal', async () => {
    const id = await createSubmitted(server, biologist)
    await manager.post(`/api/proposals/${id}/decision`, { decision: 'approve', comment: 'Fine.' })
    expect((await viewer.post(`/api/proposals/${id}/comments`, { body: 'After approval.' })).status).toBe(201)
  })

  it('mentions by @address and by id e-mail each mentioned person once, never the commenter', async () => {
    await server.mail.clear()
    const id = await createDraft(server, biologist, 'Mentions')
    const viewerId = await userId(server, demo.viewer)
    const managerId = await userId(server, demo.manager)
    const posted = await biologist.post(`/api/proposals/${id}/comments`, {
      body: `@${demo.manager} could you check the load? Also @nobody@nowhere.test and @${demo.biologist} (myself).`,
      mentions: [viewerId, managerId],
    })
    expect(posted.status).toBe(201)
    expect(posted.body.mentions.map((person: { name: string }) => person.name)).toEqual(['Morgan Ellery', 'Robin Okafor', 'Sasha Whitfield'])
    const toManager = await waitForMail(server, demo.manager, /^Robin Okafor mentioned you: Mentions$/)
    expect(toManager.text).toContain('could you check the load?')
    expect(toManager.text).toContain(`${server.url}/reviews/${id}#comment-${posted.body.id}`)
    await waitForMail(server, demo.viewer, /mentioned you: Mentions/)
    expect((await mailTo(server, demo.manager)).filter(message => /mentioned you: Mentions/.test(message.subject))).toHaveLength(1)
    const outbox = await server.db.query(`SELECT to_address FROM outbox_messages WHERE subject = 'Robin Okafor mentioned you: Mentions' ORDER BY to_address`)
    expect(outbox.rows.map(row => row.to_address)).toEqual([demo.manager, demo.viewer])
  })

  it('refuses empty, too long and foreign mentions (422) and writes nothing', async () => {
    const id = await createDraft(server, biologist)
    expectErrorAnswer(await manager.post(`/api/proposals/${id}/comments`, { body: '   ' }), 422, /Write a comment/)
    expectErrorAnswer(await manager.post(`/api/proposals/${id}/comments`, { body: 'x'.repeat(5001) }), 422, /at most 5,000/)
    const foreign = await manager.post(`/api/proposals/${id}/comments`, { body: 'Hi', mentions: [otherBiologistId] })
    expectErrorAnswer(foreign, 422)
    expect(foreign.body.issues).toEqual([{ path: 'mentions.0', message: 'Mention someone of your agency who can sign in.' }])
    expect((await manager.get(`/api/proposals/${id}/comments`)).body.items).toEqual([])
  })
})

describe('timeline', () => {
  it('lists creation, submission, comments, the decision and the revision in order, with who', async () => {
    const id = await createDraft(server, biologist, 'Timeline')
    await biologist.post(`/api/proposals/${id}/submit`, {})
    await manager.post(`/api/proposals/${id}/comments`, { body: `@${demo.biologist} why this source?` })
    await manager.post(`/api/proposals/${id}/decision`, { decision: 'return', comment: 'Explain the source.' })
    await biologist.post(`/api/proposals/${id}/submit`, {})
    await admin.post(`/api/proposals/${id}/decision`, { decision: 'approve', comment: 'Approved after the explanation.' })
    const revised = await biologist.post(`/api/proposals/${id}/revise`, {})

    expectErrorAnswer(await anonymous.get(`/api/proposals/${id}/timeline`), 401)
    expectErrorAnswer(await otherAdmin.get(`/api/proposals/${id}/timeline`), 404)
    const timeline = await viewer.get(`/api/proposals/${id}/timeline`)
    expect(timeline.status).toBe(200)
    const lines = timeline.body.items.map((item: { kind: string, actor: { name: string } | null, summary: string }) => `${item.kind} | ${item.actor?.name} | ${item.summary}`)
    expect(lines).toEqual([
      'created | Robin Okafor | started this proposal',
      'submitted | Robin Okafor | submitted the proposal for review',
      'comment | Morgan Ellery | commented',
      'decision | Morgan Ellery | returned the proposal for changes',
      'submitted | Robin Okafor | resubmitted the proposal for review',
      'decision | Avery Lindqvist | approved the proposal',
      expect.stringMatching(/^brief \| Avery Lindqvist \| issued the signed brief \(document [0-9a-f-]{36}\)$/),
      `revision | Robin Okafor | started a revision (proposal #${revised.body.proposalId})`,
    ])
    const decision = timeline.body.items.find((item: { kind: string }) => item.kind === 'decision')
    expect(decision).toMatchObject({ decision: 'return', text: 'Explain the source.' })
    const comment = timeline.body.items.find((item: { kind: string }) => item.kind === 'comment')
    expect(comment.mentions).toEqual([{ id: await userId(server, demo.biologist), name: 'Robin Okafor' }])
    const times = timeline.body.items.map((item: { at: string }) => item.at)
    expect([...times].sort()).toEqual(times)
    expect(timeline.body.people.map((person: { name: string }) => person.name)).toEqual(['Avery Lindqvist', 'Morgan Ellery', 'Robin Okafor', 'Sasha Whitfield'])

    const revision = await viewer.get(`/api/proposals/${revised.body.proposalId}/timeline`)
    expect(revision.body.items[0]).toMatchObject({ kind: 'created', summary: `started this proposal as a revision of proposal #${id}`, relatedProposalId: id })
  })
})

describe('Reviews inbox', () => {
  it('shows managers what waits for them, longest-waiting first, with author, recipient, recommendation and waiting time', async () => {
    const older = await createSubmitted(server, biologist, 'Inbox older')
    const newer = await createSubmitted(server, biologist, 'Inbox newer')
    const ownId = await createSubmitted(server, manager, 'Inbox manager own')
    await server.db.query(`UPDATE proposals SET submitted_at = now() - interval '9 days' WHERE id = $1`, [older])
    const extraManager = await addDemoUser(server, 'inbox.manager@demo.tributary.test', 'Quinn Ashby', 'manager')
    await admin.put(`/api/proposals/${newer}/reviewer`, { reviewerId: extraManager })

    expectErrorAnswer(await anonymous.get('/api/reviews'), 401)
    const inbox = await manager.get('/api/reviews')
    expect(inbox.status).toBe(200)
    expect(inbox.body.canDecide).toBe(true)
    const byId = new Map(inbox.body.waiting.map((item: { proposalId: number }) => [item.proposalId, item]))
    const ids = inbox.body.waiting.map((item: { proposalId: number }) => item.proposalId)
    expect(ids.indexOf(older)).toBeLessThan(ids.indexOf(newer))
    expect(byId.get(older)).toMatchObject({
      title: 'Inbox older', author: { name: 'Robin Okafor' }, recipient: { name: 'Cinderbrook Cove' }, waitsForMe: true, note: null,
    })
    const olderItem = byId.get(older) as { waitingMs: number }
    expect(olderItem.waitingMs).toBeGreaterThanOrEqual(9 * 86_400_000)
    expect(olderItem.waitingMs).toBeLessThan(9 * 86_400_000 + 3_600_000)
    expect(byId.get(newer)).toMatchObject({ waitsForMe: false, note: 'Assigned to Quinn Ashby', reviewer: { name: 'Quinn Ashby' } })
    expect(byId.get(ownId)).toMatchObject({ waitsForMe: false, note: 'You wrote it' })
    expect((await admin.get('/api/reviews')).body.waiting.find((item: { proposalId: number }) => item.proposalId === newer).waitsForMe).toBe(true)

    // The demo's approved proposal is among the recent decisions, with its recommendation.
    expect(inbox.body.decided.some((item: { title: string, decision: { decision: string } }) => item.title === 'Gene flow for Owlfeather Bald (demo, approved)' && item.decision.decision === 'approve')).toBe(true)

    const asViewer = await viewer.get('/api/reviews')
    expect(asViewer.body.canDecide).toBe(false)
    expect(asViewer.body.waiting.every((item: { waitsForMe: boolean }) => !item.waitsForMe)).toBe(true)
    expect(asViewer.body.waiting.map((item: { proposalId: number }) => item.proposalId)).toEqual(ids)

    const otherInbox = await otherAdmin.get('/api/reviews')
    expect(otherInbox.body.waiting).toEqual([])
    expect(otherInbox.body.decided).toEqual([])
  })

  it('shows the recommended scenario in words', async () => {
    const id = await createDraft(server, biologist, 'Inbox recommendation')
    const detail = await biologist.get(`/api/proposals/${id}`)
    const scenario = detail.body.scenarios.find((item: { isBaseline: boolean }) => !item.isBaseline)
    const patched = await biologist.patch(`/api/proposals/${id}`, { recommendedScenarioId: scenario.id, narrative: { recommendationReason: 'Small and regular.' }, version: detail.body.proposal.version })
    expect(patched.status, JSON.stringify(patched.body)).toBe(200)
    await biologist.post(`/api/proposals/${id}/submit`, {})
    const item = (await manager.get('/api/reviews')).body.waiting.find((entry: { proposalId: number }) => entry.proposalId === id)
    const { animalsPerEvent, females, males, intervalYears, events } = scenario.inputs.schedule
    expect(item.recommendation).toEqual({
      scenarioId: scenario.id,
      scenarioName: scenario.name,
      schedule: `${animalsPerEvent} animals (${females} female, ${males} male) every ${intervalYears} years, ${events} times`,
      reason: 'Small and regular.',
    })
  })
})
