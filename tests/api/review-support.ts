/**
 * Helpers for the review, audit and monitoring API tests: demo subpopulations by name, a draft
 * proposal made through the real route, more managers in the test database, captured e-mail
 * by recipient, and audit rows of one record.
 */
import { expect } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, eventually, type CapturedMail, type TestServer } from '../support/server'

/** Id of a demo subpopulation by name. */
export async function subpopulationId(server: TestServer, name: string): Promise<number> {
  const result = await server.db.query<{ id: number }>('SELECT id FROM subpopulations WHERE name = $1', [name])
  const row = result.rows[0]
  if (!row) throw new Error(`no subpopulation ${name}`)
  return row.id
}

let drafts = 0

/** A new draft through POST /api/proposals (recipient Cinderbrook Cove, source Lanternmoss Gap); returns its id. */
export async function createDraft(server: TestServer, author: ApiClient, title = `Review test ${++drafts}`): Promise<number> {
  const response = await author.post('/api/proposals', {
    title,
    recipientId: await subpopulationId(server, 'Cinderbrook Cove'),
    sourceSubpopulationIds: [await subpopulationId(server, 'Lanternmoss Gap')],
    purpose: 'Invented test proposal.',
  })
  expect(response.status, JSON.stringify(response.body)).toBe(201)
  return response.body.proposal.id as number
}

/** A draft by `author`, submitted by them; returns its id. */
export async function createSubmitted(server: TestServer, author: ApiClient, title?: string): Promise<number> {
  const id = await createDraft(server, author, title)
  const submitted = await author.post(`/api/proposals/${id}/submit`, {})
  expect(submitted.status, JSON.stringify(submitted.body)).toBe(200)
  return id
}

/**
 * Adds a user of the demo agency with `role` directly in the database, with the demo password
 * (its hash copied from the demo manager). Returns the id.
 */
export async function addDemoUser(server: TestServer, email: string, name: string, role: 'manager' | 'administrator' | 'biologist' | 'viewer'): Promise<number> {
  const result = await server.db.query<{ id: number }>(
    `INSERT INTO users (agency_id, email, name, role, password_hash, active)
     SELECT agency_id, $1, $2, $3, password_hash, true FROM users WHERE email = $4 RETURNING id`,
    [email, name, role, demo.manager],
  )
  const row = result.rows[0]
  if (!row) throw new Error('the demo manager is missing')
  return row.id
}

/** Captured messages addressed to `address`. */
export async function mailTo(server: TestServer, address: string): Promise<CapturedMail[]> {
  const messages = await server.mail.messages()
  return messages.filter(message => (Array.isArray(message.to) ? message.to : [message.to]).some(to => to.toLowerCase().includes(address.toLowerCase())))
}

/** Waits for a message to `address` whose subject matches, and returns it. */
export async function waitForMail(server: TestServer, address: string, subject: RegExp): Promise<CapturedMail> {
  return eventually(async () => (await mailTo(server, address)).find(message => subject.test(message.subject)))
}

export interface AuditRow { id: number, action: string, entity_type: string, entity_id: number | null, actor_id: number | null, before: Record<string, unknown> | null, after: Record<string, unknown> | null, created_at: Date }

/** Audit rows of a record, oldest first. */
export async function auditRowsOf(server: TestServer, entityType: string, entityId: number): Promise<AuditRow[]> {
  const result = await server.db.query<AuditRow>('SELECT * FROM audit_events WHERE entity_type = $1 AND entity_id = $2 ORDER BY id', [entityType, entityId])
  return result.rows
}

/** The proposal row's status and version. */
export async function proposalRow(server: TestServer, id: number): Promise<{ status: string, version: number, reviewer_id: number | null, submitted_at: Date | null, decided_at: Date | null }> {
  const result = await server.db.query('SELECT status, version, reviewer_id, submitted_at, decided_at FROM proposals WHERE id = $1', [id])
  return result.rows[0]
}
