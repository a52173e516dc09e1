/**
 * The audit log: one append-only `audit_events` row per change, written in the same
 * transaction as the change (so both happen or neither does).
 *
 *   await recordAudit(t, { agencyId, actorId: user.id, action: 'user.invite',
 *     entityType: 'user', entityId: row.id, before: null, after: adminUserDto(row) })
 *
 * Actions are dotted verbs ('user.invite', 'agency.update'). `before`/`after` are plain JSON
 * snapshots; keys that hold secrets (password hashes, token digests) are dropped here whatever
 * the caller passes.
 */
import type { Transaction } from 'sequelize'

export interface AuditEntry {
  agencyId: number
  /** Null for the system itself. */
  actorId: number | null
  action: string
  entityType: string
  entityId: number | null
  /** A JSON-serialisable snapshot (a DTO), or null. */
  before?: object | null
  after?: object | null
}

const SECRET_KEYS = /^(password|passwordhash|password_hash|tokenhash|token_hash|token|secret|pass)$/i

/** A JSON-safe copy without secret keys (Dates become ISO strings). */
export function auditSnapshot(value: object | null | undefined): Record<string, unknown> | null {
  if (value === null || value === undefined) return null
  const copy = JSON.parse(JSON.stringify(value)) as Record<string, unknown>
  return Object.fromEntries(Object.entries(copy).filter(([key]) => !SECRET_KEYS.test(key)))
}

/** Writes one audit event inside `transaction`. */
export async function recordAudit(transaction: Transaction, entry: AuditEntry): Promise<void> {
  const { models } = await useDb()
  await models.AuditEvent.create({
    agencyId: entry.agencyId,
    actorId: entry.actorId,
    action: entry.action,
    entityType: entry.entityType,
    entityId: entry.entityId,
    before: auditSnapshot(entry.before),
    after: auditSnapshot(entry.after),
  }, { transaction })
}
