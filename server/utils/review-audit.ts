/**
 * The audit log for administrators: filters (record, person, action, date range), a page of
 * events, the values the filters offer, and the CSV export streamed in batches.
 *
 * "Record" filters match the record itself and the rows that name it: filtering on
 * proposal #12 also lists its comments, scenarios, translocations and follow-ups (events whose
 * before/after carry `proposalId: 12`). Dates are whole UTC days, both ends included.
 */
import { Op, QueryTypes, type WhereOptions } from 'sequelize'
import type { AuditEvent } from '../db/models'
import type { AuditEventDto, AuditQuery } from '#shared/schemas/review'
import { auditEventDto } from './review-dto'

/** Events per page of GET /api/audit. */
export const AUDIT_PAGE_SIZE = 50
/** Rows read per round trip while exporting. */
const EXPORT_BATCH = 500

/**
 * The key other records use to point at a record of this type.
 *
 * @example relatedKey('proposal') // 'proposalId'
 * @example relatedKey('monitoring-observation') // 'monitoringObservationId'
 */
export function relatedKey(entityType: string): string {
  return `${entityType.replace(/[-_]([a-z0-9])/g, (_, letter: string) => letter.toUpperCase())}Id`
}

function addDay(day: string): Date {
  return new Date(Date.parse(`${day}T00:00:00Z`) + 86_400_000)
}

/** The `where` of an audit query inside one agency. */
export function auditWhere(agencyId: number, query: Omit<AuditQuery, 'page'>): WhereOptions<AuditEvent> {
  const and: WhereOptions<AuditEvent>[] = [{ agencyId }]
  if (query.entityType && query.entityId !== undefined) {
    const key = relatedKey(query.entityType)
    and.push({
      [Op.or]: [
        { entityType: query.entityType, entityId: query.entityId },
        { after: { [key]: query.entityId } },
        { before: { [key]: query.entityId } },
      ],
    } as WhereOptions<AuditEvent>)
  } else if (query.entityType) {
    and.push({ entityType: query.entityType })
  }
  if (query.actorId !== undefined) and.push({ actorId: query.actorId })
  if (query.action) and.push({ action: query.action })
  if (query.from) and.push({ createdAt: { [Op.gte]: new Date(`${query.from}T00:00:00Z`) } })
  if (query.to) and.push({ createdAt: { [Op.lt]: addDay(query.to) } })
  return { [Op.and]: and }
}

/** Distinct record types and actions, and the people who acted, in the agency's log. */
export async function auditFacets(agencyId: number): Promise<{ entityTypes: string[], actions: string[], actors: { id: number, name: string, email: string }[] }> {
  const { sequelize } = await useDb()
  const [types, actions, actors] = await Promise.all([
    sequelize.query<{ value: string }>('SELECT DISTINCT entity_type AS value FROM audit_events WHERE agency_id = :agencyId ORDER BY 1', { replacements: { agencyId }, type: QueryTypes.SELECT }),
    sequelize.query<{ value: string }>('SELECT DISTINCT action AS value FROM audit_events WHERE agency_id = :agencyId ORDER BY 1', { replacements: { agencyId }, type: QueryTypes.SELECT }),
    sequelize.query<{ id: number, name: string, email: string }>(
      `SELECT u.id, u.name, u.email FROM users u
        WHERE u.id IN (SELECT DISTINCT actor_id FROM audit_events WHERE agency_id = :agencyId AND actor_id IS NOT NULL)
        ORDER BY u.name, u.id`,
      { replacements: { agencyId }, type: QueryTypes.SELECT },
    ),
  ])
  return { entityTypes: types.map(row => row.value), actions: actions.map(row => row.value), actors }
}

const actorInclude = async () => {
  const { models } = await useDb()
  return [{ model: models.User, as: 'actor', attributes: ['id', 'name', 'email'] }]
}

/** One page of events, newest first. */
export async function auditPage(agencyId: number, query: AuditQuery): Promise<{ items: AuditEventDto[], total: number }> {
  const { models } = await useDb()
  const { rows, count } = await models.AuditEvent.findAndCountAll({
    where: auditWhere(agencyId, query),
    include: await actorInclude(),
    order: [['createdAt', 'DESC'], ['id', 'DESC']],
    limit: AUDIT_PAGE_SIZE,
    offset: (query.page - 1) * AUDIT_PAGE_SIZE,
    distinct: true,
  })
  return { items: rows.map(auditEventDto), total: count }
}

/** Header of the CSV export. */
export const AUDIT_CSV_COLUMNS = ['id', 'time_utc', 'actor_name', 'actor_email', 'action', 'record_type', 'record_id', 'before', 'after'] as const

/**
 * One CSV field (RFC 4180 quoting). Text that a spreadsheet would run as a formula (starting
 * with =, +, −, @, tab or carriage return) is prefixed with an apostrophe.
 *
 * @example csvField('plain') // 'plain'
 * @example csvField('a "quoted", text') // '"a ""quoted"", text"'
 * @example csvField('=SUM(A1)') // "'=SUM(A1)"
 * @example csvField(null) // ''
 */
export function csvField(value: unknown): string {
  if (value === null || value === undefined) return ''
  let text = typeof value === 'string' ? value : typeof value === 'number' ? String(value) : JSON.stringify(value)
  if (/^[=+\-@\t\r]/.test(text)) text = `'${text}`
  return /[",\n\r]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text
}

/** One event as a CSV line (with the line break). */
export function auditCsvLine(event: AuditEventDto): string {
  return [
    event.id, event.createdAt, event.actor?.name ?? '', event.actor?.email ?? '', event.action,
    event.entityType, event.entityId, event.before, event.after,
  ].map(csvField).join(',') + '\r\n'
}

/**
 * The matching events as a stream of CSV text, newest entry first, read `EXPORT_BATCH` rows at a
 * time (keyset on id), so a long log never sits in memory at once.
 */
export function auditCsvStream(agencyId: number, query: Omit<AuditQuery, 'page'>): ReadableStream<Uint8Array> {
  const encoder = new TextEncoder()
  let lastId: number | null = null
  let headerSent = false
  let finished = false
  return new ReadableStream<Uint8Array>({
    async pull(controller) {
      try {
        if (!headerSent) {
          headerSent = true
          // A byte-order mark so spreadsheet programs read the text as UTF-8.
          controller.enqueue(encoder.encode(`\uFEFF${AUDIT_CSV_COLUMNS.join(',')}\r\n`))
          return
        }
        if (finished) return
        const { models } = await useDb()
        const where = lastId === null ? auditWhere(agencyId, query) : { [Op.and]: [auditWhere(agencyId, query), { id: { [Op.lt]: lastId } }] }
        const rows = await models.AuditEvent.findAll({ where, include: await actorInclude(), order: [['id', 'DESC']], limit: EXPORT_BATCH })
        if (rows.length > 0) {
          lastId = rows[rows.length - 1]?.id ?? null
          controller.enqueue(encoder.encode(rows.map(row => auditCsvLine(auditEventDto(row))).join('')))
        }
        if (rows.length < EXPORT_BATCH) {
          finished = true
          controller.close()
        }
      } catch (error) {
        console.error('[audit] CSV export failed:', error)
        controller.error(error)
      }
    },
  })
}
