/**
 * The audit log is append-only in the database itself, whatever path a write takes: plain SQL,
 * the Sequelize model the app uses (instance save / destroy, static update / destroy), a
 * statement that matches no row, or a transaction that also did other work (which is rolled
 * back with it). And an audit row written inside a transaction that rolls back does not exist.
 */
import { QueryTypes } from 'sequelize'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createMigratedDatabase, expectRefused, SQLSTATE, type MigratedDatabase } from './helpers'

let db: MigratedDatabase
let agencyId: number
let userId: number

async function count(sql: string, replacements: Record<string, unknown> = {}): Promise<number> {
  const [row] = await db.sequelize.query<{ n: number }>(sql, { replacements, type: QueryTypes.SELECT })
  return Number(row?.n ?? 0)
}

async function newEvent(action = 'proposal.approve'): Promise<number> {
  const event = await db.models.AuditEvent.create({ agencyId, actorId: userId, action, entityType: 'proposal', entityId: 7, before: { status: 'submitted' }, after: { status: 'approved' } })
  return event.id
}

beforeAll(async () => {
  db = await createMigratedDatabase()
  const agency = await db.models.Agency.create({ name: 'Audit Test Agency', shortName: 'ATA', logoStorageKey: null, signingCertificateStorageKey: null })
  agencyId = agency.id
  const user = await db.models.User.create({ agencyId, email: 'auditor@example.test', name: 'Auditor', role: 'manager', passwordHash: null, lastSignInAt: null, invitedAt: null })
  userId = user.id
})

afterAll(async () => {
  await db?.dispose()
})

describe('audit_events refuses every change but INSERT', () => {
  it('plain SQL: UPDATE and DELETE of a row, and of no row at all, are refused', async () => {
    const id = await newEvent()
    await expectRefused(db.sequelize.query('UPDATE audit_events SET after = NULL WHERE id = :id', { replacements: { id } }), SQLSTATE.insufficientPrivilege, /append-only: UPDATE/)
    await expectRefused(db.sequelize.query('DELETE FROM audit_events WHERE id = :id', { replacements: { id } }), SQLSTATE.insufficientPrivilege, /append-only: DELETE/)
    // Statement-level: refused even when nothing would match.
    await expectRefused(db.sequelize.query('UPDATE audit_events SET action = action WHERE false'), SQLSTATE.insufficientPrivilege, /append-only: UPDATE/)
    await expectRefused(db.sequelize.query('DELETE FROM audit_events WHERE false'), SQLSTATE.insufficientPrivilege, /append-only: DELETE/)
    await expectRefused(db.sequelize.query('TRUNCATE audit_events'), SQLSTATE.insufficientPrivilege, /append-only: TRUNCATE/)
    expect(await count('SELECT count(*)::int AS n FROM audit_events WHERE id = :id AND after IS NOT NULL', { id })).toBe(1)
  })

  it('through the model the app uses: save, destroy, update and bulk destroy are refused', async () => {
    const id = await newEvent()
    const event = await db.models.AuditEvent.findByPk(id)
    expect(event).not.toBeNull()
    event!.action = 'tampered' // the row was just created, so it is found
    await expectRefused(event!.save(), SQLSTATE.insufficientPrivilege, /append-only: UPDATE/)
    await expectRefused(event!.destroy(), SQLSTATE.insufficientPrivilege, /append-only: DELETE/)
    await expectRefused(db.models.AuditEvent.update({ action: 'tampered' }, { where: { id } }), SQLSTATE.insufficientPrivilege, /append-only: UPDATE/)
    await expectRefused(db.models.AuditEvent.destroy({ where: { agencyId } }), SQLSTATE.insufficientPrivilege, /append-only: DELETE/)
    const kept = await db.models.AuditEvent.findByPk(id)
    expect(kept?.action).toBe('proposal.approve')
  })

  it('a refused change inside a transaction rolls back the work done before it', async () => {
    const id = await newEvent()
    const before = await count('SELECT count(*)::int AS n FROM comments')
    await expectRefused(db.sequelize.transaction(async (transaction) => {
      await db.sequelize.query(`INSERT INTO agencies (name, short_name) VALUES ('Rolled Back Agency', 'RBA')`, { transaction })
      await db.sequelize.query('UPDATE audit_events SET actor_id = NULL WHERE id = :id', { replacements: { id }, transaction })
    }), SQLSTATE.insufficientPrivilege, /append-only/)
    expect(await count(`SELECT count(*)::int AS n FROM agencies WHERE name = 'Rolled Back Agency'`)).toBe(0)
    expect(await count('SELECT count(*)::int AS n FROM comments')).toBe(before)
  })

  it('an audit row written in a transaction that rolls back does not exist (audit and change commit together)', async () => {
    const before = await count('SELECT count(*)::int AS n FROM audit_events')
    await expect(db.sequelize.transaction(async (transaction) => {
      await db.models.AuditEvent.create({ agencyId, actorId: userId, action: 'proposal.decline', entityType: 'proposal', entityId: 9 }, { transaction })
      throw new Error('the change failed after its audit row')
    })).rejects.toThrow('the change failed after its audit row')
    expect(await count('SELECT count(*)::int AS n FROM audit_events')).toBe(before)
    expect(await count(`SELECT count(*)::int AS n FROM audit_events WHERE action = 'proposal.decline'`)).toBe(0)
  })

  it('INSERT keeps working', async () => {
    const before = await count('SELECT count(*)::int AS n FROM audit_events')
    await newEvent('proposal.submit')
    expect(await count('SELECT count(*)::int AS n FROM audit_events')).toBe(before + 1)
  })
})
