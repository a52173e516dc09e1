/**
 * Review e-mails and the audit trail over HTTP, read back from the local SMTP fake and the
 * database: who is written to on submit, on a decision and on reassignment; audit rows written
 * in the same transaction as the change (a refused or failed decision leaves neither a decision
 * nor an audit row nor a queued e-mail); a mail server that is down never blocks or loses a
 * decision — the outbox retries once it is back.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { freePort } from '../support/ports'
import { demo, eventually, useServer } from '../support/server'
import { expectErrorAnswer, userId } from './auth-support'
import { addDemoUser, auditRowsOf, createDraft, createSubmitted, mailTo, proposalRow, waitForMail } from './review-support'

const server = useServer()

let biologist: ApiClient
let manager: ApiClient
let admin: ApiClient
const secondManagerEmail = 'second.manager@demo.tributary.test'
const inactiveManagerEmail = 'retired.manager@demo.tributary.test'
let secondManagerId: number

beforeAll(async () => {
  secondManagerId = await addDemoUser(server, secondManagerEmail, 'Jordan Halvorsen', 'manager')
  const retired = await addDemoUser(server, inactiveManagerEmail, 'Kit Marlowe', 'manager')
  await server.db.query('UPDATE users SET active = false WHERE id = $1', [retired])
  biologist = await server.signIn(demo.biologist)
  manager = await server.signIn(demo.manager)
  admin = await server.signIn(demo.admin)
})

describe('e-mail', () => {
  it('on submit: every active manager of the agency other than the author, with a link to the review', async () => {
    await server.mail.clear()
    const id = await createSubmitted(server, biologist, 'Mail on submit')
    for (const address of [demo.manager, secondManagerEmail]) {
      const mail = await waitForMail(server, address, /^Review requested: Mail on submit$/)
      expect(mail.text).toContain('Robin Okafor submitted the proposal "Mail on submit" (recipient: Cinderbrook Cove)')
      expect(mail.text).toContain(`${server.url}/reviews/${id}`)
      expect(mail.text).toContain('Any manager other than the author may decide on it.')
    }
    // Nobody else: not the author, not the administrator (not assigned), not the viewer, not a deactivated manager.
    const outbox = await server.db.query('SELECT to_address FROM outbox_messages WHERE subject = $1 ORDER BY to_address', ['Review requested: Mail on submit'])
    expect(outbox.rows.map(row => row.to_address)).toEqual([demo.manager, secondManagerEmail].sort())
  })

  it('on submit by a manager: the other managers, not the author', async () => {
    await createSubmitted(server, manager, 'Manager wrote this')
    await waitForMail(server, secondManagerEmail, /Manager wrote this/)
    const outbox = await server.db.query('SELECT to_address FROM outbox_messages WHERE subject LIKE $1', ['%Manager wrote this'])
    expect(outbox.rows.map(row => row.to_address)).toEqual([secondManagerEmail])
  })

  it('on a decision: the author, with the decision and its comment', async () => {
    const id = await createSubmitted(server, biologist, 'Mail on decision')
    const decided = await manager.post(`/api/proposals/${id}/decision`, { decision: 'return', comment: 'Please add the quarantine plan.\nAnd the permits.' })
    expect(decided.status).toBe(200)
    const mail = await waitForMail(server, demo.biologist, /^Returned for changes: Mail on decision$/)
    expect(mail.text).toContain('Morgan Ellery returned for changes your proposal "Mail on decision"')
    expect(mail.text).toContain('> Please add the quarantine plan.\n> And the permits.')
    expect(mail.text).toContain(`${server.url}/proposals/${id}`)

    await biologist.post(`/api/proposals/${id}/submit`, {})
    await waitForMail(server, demo.manager, /^Resubmitted: Mail on decision$/)
    await manager.post(`/api/proposals/${id}/decision`, { decision: 'approve', comment: 'Thank you; approved.' })
    const approval = await waitForMail(server, demo.biologist, /^Approved: Mail on decision$/)
    expect(approval.text).toContain('> Thank you; approved.')
  })

  it('on reassignment: the new reviewer', async () => {
    const id = await createSubmitted(server, biologist, 'Mail on reassignment')
    expect((await admin.put(`/api/proposals/${id}/reviewer`, { reviewerId: secondManagerId })).status).toBe(200)
    const mail = await waitForMail(server, secondManagerEmail, /^You are the reviewer: Mail on reassignment$/)
    expect(mail.text).toContain('Avery Lindqvist assigned you as the reviewer')
    expect(mail.text).toContain('It is submitted and waits for your decision')
  })
})

describe('audit trail', () => {
  it('each workflow step writes one audit event with who, before and after, in the transaction of the change', async () => {
    const id = await createSubmitted(server, biologist, 'Audited')
    await manager.post(`/api/proposals/${id}/decision`, { decision: 'approve', comment: 'Audited approval.' })
    const rows = await auditRowsOf(server, 'proposal', id)
    expect(rows.map(row => row.action)).toEqual(['proposal.create', 'proposal.submit', 'proposal.approve', 'brief.issue'])
    const [, submit, approve, brief] = rows
    expect(brief).toMatchObject({ actor_id: await userId(server, demo.manager), after: expect.objectContaining({ documentId: expect.any(String) }) })
    expect(submit).toMatchObject({ actor_id: await userId(server, demo.biologist), before: expect.objectContaining({ status: 'draft' }), after: expect.objectContaining({ status: 'submitted' }) })
    expect(approve).toMatchObject({
      actor_id: await userId(server, demo.manager),
      before: expect.objectContaining({ status: 'submitted' }),
      after: expect.objectContaining({ status: 'approved', decision: expect.objectContaining({ decision: 'approve', comment: 'Audited approval.' }) }),
    })
    // The decision row and the outbox row exist exactly when the audit row does (same commit).
    const decision = await server.db.query('SELECT id FROM decisions WHERE proposal_id = $1', [id])
    expect((approve!.after as { decision: { id: number } }).decision.id).toBe(decision.rows[0].id)
    const versions = await server.db.query('SELECT version, changed_fields FROM proposal_versions WHERE proposal_id = $1 ORDER BY version', [id])
    expect(versions.rows.map(row => row.version)).toEqual([0, 1, 2])
  })

  it('a refused decision writes nothing: no decision, no audit row, no e-mail', async () => {
    const id = await createSubmitted(server, manager, 'Refused decision')
    const before = await server.db.query('SELECT count(*)::int AS n FROM outbox_messages')
    expectErrorAnswer(await manager.post(`/api/proposals/${id}/decision`, { decision: 'approve', comment: 'My own.' }), 403)
    expect((await auditRowsOf(server, 'proposal', id)).map(row => row.action)).toEqual(['proposal.create', 'proposal.submit'])
    expect((await server.db.query('SELECT count(*)::int AS n FROM decisions WHERE proposal_id = $1', [id])).rows[0].n).toBe(0)
    expect((await server.db.query('SELECT count(*)::int AS n FROM outbox_messages')).rows[0].n).toBe(before.rows[0].n)
  })

  it('a decision that fails part-way (after its audit row is inserted) leaves no audit row, no decision and the status unchanged', async () => {
    const id = await createSubmitted(server, biologist, 'Fails while queueing mail')
    // Make the last step of the decision — queueing the author's e-mail — fail inside the database.
    await server.db.query(`
      CREATE FUNCTION test_refuse_decision_mail() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF NEW.subject LIKE '%Fails while queueing mail' THEN RAISE EXCEPTION 'mail table unavailable (test)'; END IF;
        RETURN NEW;
      END $$;
      CREATE TRIGGER test_refuse_decision_mail BEFORE INSERT ON outbox_messages FOR EACH ROW EXECUTE FUNCTION test_refuse_decision_mail();`)
    try {
      const failed = await manager.post(`/api/proposals/${id}/decision`, { decision: 'approve', comment: 'Will not stick.' })
      expectErrorAnswer(failed, 500, /Something went wrong on our side/)
    } finally {
      await server.db.query('DROP TRIGGER test_refuse_decision_mail ON outbox_messages; DROP FUNCTION test_refuse_decision_mail();')
    }
    expect((await auditRowsOf(server, 'proposal', id)).map(row => row.action)).toEqual(['proposal.create', 'proposal.submit'])
    expect((await server.db.query('SELECT count(*)::int AS n FROM decisions WHERE proposal_id = $1', [id])).rows[0].n).toBe(0)
    expect((await proposalRow(server, id)).status).toBe('submitted')
    // Once the database is healthy again the same decision goes through.
    expect((await manager.post(`/api/proposals/${id}/decision`, { decision: 'approve', comment: 'Now it sticks.' })).status).toBe(200)
  })

  it('comments write an audit event that names the proposal', async () => {
    const id = await createDraft(server, biologist)
    const posted = await manager.post(`/api/proposals/${id}/comments`, { body: 'Audited comment.' })
    const rows = await auditRowsOf(server, 'comment', posted.body.id)
    expect(rows).toHaveLength(1)
    expect(rows[0]).toMatchObject({ action: 'comment.create', after: { proposalId: id, body: 'Audited comment.', mentions: [] } })
  })
})

describe('a mail server that is down', () => {
  it('never blocks or loses a decision: it is recorded at once, and the e-mail goes out when the server is back', async () => {
    const smtpPort = server.env.NUXT_SMTP_PORT!
    const id = await createSubmitted(server, biologist, 'Decided while mail is down')
    await server.restart({ NUXT_SMTP_PORT: String(await freePort()) })
    try {
      const client = await server.signIn(demo.manager)
      const decided = await client.post(`/api/proposals/${id}/decision`, { decision: 'approve', comment: 'Approved during the outage.' })
      expect(decided.status).toBe(200)
      expect((await proposalRow(server, id)).status).toBe('approved')
      const failedAttempt = await eventually(async () => {
        const rows = await server.db.query(`SELECT id, status, attempts, last_error FROM outbox_messages WHERE subject = 'Approved: Decided while mail is down'`)
        const row = rows.rows[0]
        return row && row.attempts >= 1 ? row : undefined
      })
      expect(failedAttempt).toMatchObject({ status: 'queued' })
      expect(failedAttempt.last_error).toBeTruthy()
      expect(await mailTo(server, demo.biologist).then(messages => messages.filter(m => m.subject === 'Approved: Decided while mail is down'))).toEqual([])
    } finally {
      await server.restart({ NUXT_SMTP_PORT: smtpPort })
    }
    // The retry is due later; bring it forward instead of waiting for the backoff.
    await server.db.query(`UPDATE outbox_messages SET next_attempt_at = now() WHERE subject = 'Approved: Decided while mail is down'`)
    const mail = await waitForMail(server, demo.biologist, /^Approved: Decided while mail is down$/)
    expect(mail.text).toContain('Approved during the outage.')
    // The row is marked sent just after the SMTP server accepted the message.
    await eventually(async () => (await server.db.query(`SELECT status FROM outbox_messages WHERE subject = 'Approved: Decided while mail is down'`)).rows[0]?.status === 'sent')
  })
})
