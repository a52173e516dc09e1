/**
 * The audit log for administrators over HTTP: who may read it, each filter (record — with the
 * rows that name it —, person, action, date range with both ends included), paging, the values
 * offered to the filters, bad filters, and the CSV export (streamed in batches, quoted, safe
 * to open in a spreadsheet, the same rows as the filtered list).
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword, userId } from './auth-support'
import { createSubmitted } from './review-support'

const server = useServer()

let anonymous: ApiClient
let viewer: ApiClient
let biologist: ApiClient
let manager: ApiClient
let admin: ApiClient
let otherAdmin: ApiClient
let demoAgencyId: number
let proposalId: number
let commentId: number

/** Inserts audit rows directly (INSERT is the one statement the log allows). */
async function insertEvents(rows: { action: string, at: string, entityType?: string, entityId?: number | null, actorEmail?: string, after?: object }[]): Promise<void> {
  for (const row of rows) {
    await server.db.query(
      `INSERT INTO audit_events (agency_id, actor_id, action, entity_type, entity_id, before, after, created_at)
       VALUES ($1, (SELECT id FROM users WHERE email = $2), $3, $4, $5, NULL, $6, $7)`,
      [demoAgencyId, row.actorEmail ?? demo.admin, row.action, row.entityType ?? 'test-record', row.entityId ?? null, JSON.stringify(row.after ?? {}), row.at],
    )
  }
}

beforeAll(async () => {
  const other = await createOtherAgency(server)
  anonymous = server.anonymous()
  viewer = await server.signIn(demo.viewer)
  biologist = await server.signIn(demo.biologist)
  manager = await server.signIn(demo.manager)
  admin = await server.signIn(demo.admin)
  otherAdmin = await server.signIn(other.adminEmail, otherAgencyPassword)
  demoAgencyId = (await server.db.query('SELECT agency_id FROM users WHERE email = $1', [demo.admin])).rows[0].agency_id
  proposalId = await createSubmitted(server, biologist, 'Audit filters')
  commentId = (await manager.post(`/api/proposals/${proposalId}/comments`, { body: 'Needs "quotes", commas,\nand =SUM(A1) to be safe.' })).body.id
  await manager.post(`/api/proposals/${proposalId}/decision`, { decision: 'approve', comment: 'Approved for the audit test.' })
})

describe('GET /api/audit', () => {
  it('administrators only: 401 anonymous, 403 other roles; each administrator sees their own agency', async () => {
    expectErrorAnswer(await anonymous.get('/api/audit'), 401)
    for (const [client, role] of [[viewer, 'viewer'], [biologist, 'biologist'], [manager, 'manager']] as const) {
      const refused = await client.get('/api/audit')
      expectErrorAnswer(refused, 403)
      expect(refused.body.message).toBe(`Your role (${role}) cannot do this: it needs administrator.`)
    }
    const mine = await admin.get('/api/audit')
    expect(mine.status).toBe(200)
    const ownRows = await server.db.query('SELECT count(*)::int AS n FROM audit_events WHERE agency_id = $1', [demoAgencyId])
    expect(mine.body.total).toBe(ownRows.rows[0].n)
    expect(mine.body.total).toBeGreaterThanOrEqual(5) // this file's create, submit, comment, approve and brief
    const theirs = await otherAdmin.get('/api/audit')
    expect(theirs.status).toBe(200)
    expect(theirs.body.items.every((item: { entityId: number | null, action: string }) => !(item.action.startsWith('proposal.') && item.entityId === proposalId))).toBe(true)
    const counted = await server.db.query('SELECT count(*)::int AS n FROM audit_events WHERE agency_id <> $1', [demoAgencyId])
    expect(theirs.body.total).toBe(counted.rows[0].n)
  })

  it('filters by record: the proposal itself and the rows that name it (its comment)', async () => {
    const page = await admin.get(`/api/audit?entityType=proposal&entityId=${proposalId}`)
    expect(page.status).toBe(200)
    const actions = page.body.items.map((item: { action: string }) => item.action)
    expect([...actions].sort()).toEqual(['brief.issue', 'comment.create', 'proposal.approve', 'proposal.create', 'proposal.submit'])
    expect(actions.slice(0, 2).sort()).toEqual(['brief.issue', 'proposal.approve']) // newest first (one transaction)
    const approve = page.body.items.find((item: { action: string }) => item.action === 'proposal.approve')
    expect(approve).toMatchObject({
      entityType: 'proposal', entityId: proposalId,
      actor: { id: await userId(server, demo.manager), name: 'Morgan Ellery', email: demo.manager },
      before: expect.objectContaining({ status: 'submitted' }), after: expect.objectContaining({ status: 'approved' }),
    })
    const commentOnly = await admin.get(`/api/audit?entityType=comment&entityId=${commentId}`)
    expect(commentOnly.body.items.map((item: { action: string }) => item.action)).toEqual(['comment.create'])
    const byType = await admin.get('/api/audit?entityType=comment')
    expect(byType.body.items.every((item: { entityType: string }) => item.entityType === 'comment')).toBe(true)
  })

  it('filters by person and by action', async () => {
    const managerId = await userId(server, demo.manager)
    const byManager = await admin.get(`/api/audit?actorId=${managerId}`)
    expect(byManager.body.total).toBeGreaterThanOrEqual(2)
    expect(byManager.body.items.every((item: { actor: { id: number } }) => item.actor.id === managerId)).toBe(true)
    const approvals = await admin.get('/api/audit?action=proposal.approve')
    expect(approvals.body.items.length).toBeGreaterThanOrEqual(1)
    expect(approvals.body.items.every((item: { action: string }) => item.action === 'proposal.approve')).toBe(true)
    const both = await admin.get(`/api/audit?action=proposal.approve&actorId=${managerId}&entityType=proposal&entityId=${proposalId}`)
    expect(both.body.total).toBe(1)
  })

  it('filters by date range, both days included (UTC)', async () => {
    await insertEvents([
      { action: 'test.dated', at: '2020-01-14T23:59:59Z' },
      { action: 'test.dated', at: '2020-01-15T00:00:00Z' },
      { action: 'test.dated', at: '2020-01-20T23:59:59Z' },
      { action: 'test.dated', at: '2020-01-21T00:00:00Z' },
    ])
    const range = await admin.get('/api/audit?action=test.dated&from=2020-01-15&to=2020-01-20')
    expect(range.body.items.map((item: { createdAt: string }) => item.createdAt)).toEqual(['2020-01-20T23:59:59.000Z', '2020-01-15T00:00:00.000Z'])
    expect((await admin.get('/api/audit?action=test.dated&from=2020-01-21')).body.total).toBe(1)
    expect((await admin.get('/api/audit?action=test.dated&to=2020-01-14')).body.total).toBe(1)
    expect((await admin.get('/api/audit?action=test.dated&from=&to=')).body.total).toBe(4)
  })

  it('pages 50 at a time, newest first, and offers the filters\' values', async () => {
    await insertEvents(Array.from({ length: 120 }, (_, index) => ({
      action: 'test.bulk', at: new Date(Date.UTC(2021, 0, 1) + index * 60_000).toISOString(), entityId: index + 1,
    })))
    const first = await admin.get('/api/audit?action=test.bulk')
    expect(first.body).toMatchObject({ page: 1, pageSize: 50, total: 120 })
    expect(first.body.items).toHaveLength(50)
    expect(first.body.items[0].entityId).toBe(120)
    const third = await admin.get('/api/audit?action=test.bulk&page=3')
    expect(third.body.items.map((item: { entityId: number }) => item.entityId)).toEqual(Array.from({ length: 20 }, (_, index) => 20 - index))
    expect((await admin.get('/api/audit?action=test.bulk&page=4')).body.items).toEqual([])
    expect(first.body.entityTypes).toEqual(expect.arrayContaining(['comment', 'proposal', 'test-record']))
    expect(first.body.actions).toEqual(expect.arrayContaining(['proposal.approve', 'test.bulk']))
    expect(first.body.actors.map((actor: { email: string }) => actor.email)).toEqual(expect.arrayContaining([demo.admin, demo.manager, demo.biologist]))
  })

  it('refuses malformed filters with 422 and a reason per field', async () => {
    const cases: [string, string][] = [
      ['from=2020-02-01&to=2020-01-01', 'to'],
      ['from=2020-02-30', 'from'],
      ['from=yesterday', 'from'],
      ['entityId=5', 'entityType'],
      ['entityType=proposal&entityId=five', 'entityId'],
      ['actorId=-1', 'actorId'],
      ['page=0', 'page'],
      ['entityType=DROP%20TABLE', 'entityType'],
    ]
    for (const [query, path] of cases) {
      const response = await admin.get(`/api/audit?${query}`)
      expectErrorAnswer(response, 422)
      expect(response.body.issues.map((issue: { path: string }) => issue.path), query).toContain(path)
    }
  })
})

/** Parses RFC 4180 CSV (quoted fields with "" escapes and line breaks); a leading byte-order mark is skipped. */
function parseCsv(csv: string): string[][] {
  const text = csv.startsWith('\uFEFF') ? csv.slice(1) : csv
  const rows: string[][] = []
  let field = ''
  let row: string[] = []
  let quoted = false
  for (let index = 0; index < text.length; index++) {
    const char = text[index]!
    const next = text[index + 1]
    if (quoted) {
      if (char === '"' && next === '"') {
        field += '"'
        index++
      } else if (char === '"') {
        quoted = false
      } else {
        field += char
      }
    } else if (char === '"') {
      quoted = true
    } else if (char === ',') {
      row.push(field)
      field = ''
    } else if (char === '\r' && next === '\n') {
      row.push(field)
      rows.push(row)
      row = []
      field = ''
      index++
    } else {
      field += char
    }
  }
  if (field !== '' || row.length) {
    row.push(field)
    rows.push(row)
  }
  return rows
}

describe('GET /api/audit/export.csv', () => {
  it('administrators only', async () => {
    expectErrorAnswer(await anonymous.get('/api/audit/export.csv'), 401)
    for (const client of [viewer, biologist, manager]) expectErrorAnswer(await client.get('/api/audit/export.csv'), 403)
    expectErrorAnswer(await admin.get('/api/audit/export.csv?from=nope'), 422)
  })

  it('exports the filtered rows as CSV: header, quoting, formula guard, same rows as the list', async () => {
    const response = await admin.get(`/api/audit/export.csv?entityType=proposal&entityId=${proposalId}`)
    expect(response.status).toBe(200)
    expect(response.headers.get('content-type')).toBe('text/csv; charset=utf-8')
    expect(response.headers.get('content-disposition')).toMatch(/^attachment; filename="audit-log-\d{4}-\d{2}-\d{2}\.csv"$/)
    const [header, ...rows] = parseCsv(response.body as string)
    // The raw bytes start with the UTF-8 byte-order mark (fetch's text() drops it).
    const raw = new Uint8Array(await (await fetch(`${server.url}/api/audit/export.csv?action=none`, { headers: { cookie: admin.cookieHeader } })).arrayBuffer())
    expect([...raw.slice(0, 3)]).toEqual([0xEF, 0xBB, 0xBF])
    expect(header).toEqual(['id', 'time_utc', 'actor_name', 'actor_email', 'action', 'record_type', 'record_id', 'before', 'after'])
    const listed = await admin.get(`/api/audit?entityType=proposal&entityId=${proposalId}`)
    expect(rows.map(row => Number(row[0]))).toEqual(listed.body.items.map((item: { id: number }) => item.id))
    const comment = rows.find(row => row[4] === 'comment.create')!
    expect(JSON.parse(comment[8]!)).toMatchObject({ proposalId, body: 'Needs "quotes", commas,\nand =SUM(A1) to be safe.' })
    const approve = rows.find(row => row[4] === 'proposal.approve')!
    const listedApprove = listed.body.items.find((item: { action: string }) => item.action === 'proposal.approve')
    expect(approve.slice(1, 7)).toEqual([listedApprove.createdAt, 'Morgan Ellery', demo.manager, 'proposal.approve', 'proposal', String(proposalId)])
  })

  it('guards cells a spreadsheet would run as formulas', async () => {
    await insertEvents([{ action: 'test.formula', at: '2022-05-05T10:00:00Z', entityType: 'test-record', after: { note: 'x' } }])
    await server.db.query(`UPDATE users SET name = '=HYPERLINK("http://evil")' WHERE email = $1`, [demo.viewer])
    try {
      await insertEvents([{ action: 'test.formula', at: '2022-05-06T10:00:00Z', actorEmail: demo.viewer }])
      const rows = parseCsv((await admin.get('/api/audit/export.csv?action=test.formula')).body).slice(1)
      expect(rows).toHaveLength(2)
      expect(rows[0]![2]).toBe('\'=HYPERLINK("http://evil")')
    } finally {
      await server.db.query(`UPDATE users SET name = 'Sasha Whitfield' WHERE email = $1`, [demo.viewer])
    }
  })

  it('streams a long export completely, newest entry first', async () => {
    await insertEvents(Array.from({ length: 1234 }, (_, index) => ({ action: 'test.long', at: new Date(Date.UTC(2023, 0, 1) + index * 1000).toISOString(), entityId: index + 1 })))
    const response = await admin.get('/api/audit/export.csv?action=test.long')
    const rows = parseCsv(response.body as string).slice(1)
    expect(rows).toHaveLength(1234)
    expect(rows.map(row => Number(row[6]))).toEqual(Array.from({ length: 1234 }, (_, index) => 1234 - index))
    const ids = rows.map(row => Number(row[0]))
    expect([...ids].sort((a, b) => b - a)).toEqual(ids)
  })
})
