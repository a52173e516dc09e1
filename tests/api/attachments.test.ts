/**
 * Attachments of a subpopulation: list and upload per role, the type allow-list (name ending
 * and first bytes), the size limit (413, also mid-stream), file-name cleaning, download through
 * a presigned link, delete by the uploader or an administrator only (others 403), audit rows,
 * and an object-store outage (503, nothing recorded).
 */
import { beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword } from './auth-support'
import { addSecondBiologist, demoRecords, storedKeys, streamLargeUpload, uploadForm } from './genotypes-support'

const server = useServer()

type Caller = 'anonymous' | 'viewer' | 'biologist' | 'manager' | 'administrator' | 'otherAdmin' | 'secondBiologist'
let clients: Record<Caller, ApiClient>
let subpopulationId: number
let path: string

const PDF = new TextEncoder().encode('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n')
const PNG = new Uint8Array([0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52])
const JPEG = new Uint8Array([0xFF, 0xD8, 0xFF, 0xE0, 0, 16, 0x4A, 0x46, 0x49, 0x46, 0])
const DOCX = new Uint8Array([0x50, 0x4B, 0x03, 0x04, 20, 0, 6, 0, 8, 0])

beforeAll(async () => {
  const records = await demoRecords(server)
  subpopulationId = records.subpopulations['Cinderbrook Cove']!
  path = `/api/subpopulations/${subpopulationId}/attachments`
  const other = await createOtherAgency(server)
  const second = await addSecondBiologist(server, records.agencyId)
  clients = {
    anonymous: server.anonymous(),
    viewer: await server.signIn(demo.viewer),
    biologist: await server.signIn(demo.biologist),
    manager: await server.signIn(demo.manager),
    administrator: await server.signIn(demo.admin),
    otherAdmin: await server.signIn(other.adminEmail, otherAgencyPassword),
    secondBiologist: await server.signIn(second),
  }
})

async function attachmentCount(): Promise<number> {
  return Number((await server.db.query<{ count: string }>('SELECT count(*) FROM attachments')).rows[0]?.count)
}

const attachmentKeys = async () => (await storedKeys(server)).filter(key => key.startsWith('attachments/'))

describe('GET and POST /api/subpopulations/:id/attachments', () => {
  it('per role: 401 anonymous, viewer reads but cannot attach (403), editors attach (201), other agency 404', async () => {
    expectErrorAnswer(await clients.anonymous.get(path), 401)
    expectErrorAnswer(await uploadForm(clients.anonymous, path, { name: 'permit.pdf', content: PDF }), 401)
    expectErrorAnswer(await uploadForm(clients.viewer, path, { name: 'permit.pdf', content: PDF }), 403, /viewer/)
    expectErrorAnswer(await clients.otherAdmin.get(path), 404)
    expectErrorAnswer(await uploadForm(clients.otherAdmin, path, { name: 'permit.pdf', content: PDF }), 404)
    for (const role of ['biologist', 'manager', 'administrator'] as const) {
      const created = await uploadForm(clients[role], path, { name: `permit-${role}.pdf`, content: PDF })
      expect(created.status, JSON.stringify(created.body)).toBe(201)
      expect(created.body).toMatchObject({ fileName: `permit-${role}.pdf`, contentType: 'application/pdf', typeLabel: 'PDF', sizeBytes: PDF.length, canDelete: true })
    }
    for (const role of ['viewer', 'biologist', 'manager', 'administrator'] as const) {
      const list = await clients[role].get(path)
      expect(list.status, role).toBe(200)
      expect(list.body.items.map((a: { fileName: string }) => a.fileName)).toEqual(['permit-administrator.pdf', 'permit-manager.pdf', 'permit-biologist.pdf'])
      expect(list.body.canUpload).toBe(role !== 'viewer')
      expect(list.body.items.filter((a: { canDelete: boolean }) => a.canDelete).length).toBe(role === 'administrator' ? 3 : role === 'viewer' ? 0 : 1)
    }
  })

  it('stores the file with its SHA-256 and writes an audit row', async () => {
    const created = await uploadForm(clients.biologist, path, { name: 'survey-photo.png', content: PNG })
    expect(created.status).toBe(201)
    const row = await server.db.query('SELECT storage_key, checksum_sha256, uploaded_by FROM attachments WHERE id = $1', [created.body.id])
    const { createHash } = await import('node:crypto')
    expect(row.rows[0].checksum_sha256).toBe(createHash('sha256').update(PNG).digest('hex'))
    expect(row.rows[0].storage_key).toMatch(/^attachments\/agency-\d+\/owner-\d+\/[0-9a-f-]{36}$/)
    expect(await attachmentKeys()).toContain(row.rows[0].storage_key)
    const audit = await server.db.query(`SELECT action, actor_id FROM audit_events WHERE entity_type = 'attachment' AND entity_id = $1`, [created.body.id])
    expect(audit.rows).toEqual([{ action: 'attachment.upload', actor_id: row.rows[0].uploaded_by }])
  })

  it('type allow-list: other endings → 415; an ending whose bytes do not match → 415; nothing stored', async () => {
    const before = await attachmentCount()
    const keysBefore = await attachmentKeys()
    expectErrorAnswer(await uploadForm(clients.biologist, path, { name: 'tool.exe', content: 'MZ' }), 415, /Accepted: pdf, png, jpg, jpeg, csv, txt, docx, xlsx/)
    expectErrorAnswer(await uploadForm(clients.biologist, path, { name: 'page.html', content: '<script>' }), 415)
    expectErrorAnswer(await uploadForm(clients.biologist, path, { name: 'noending', content: 'x' }), 415)
    expectErrorAnswer(await uploadForm(clients.biologist, path, { name: 'fake.pdf', content: '<html>not a pdf</html>' }), 415, /do not look like a PDF/)
    expectErrorAnswer(await uploadForm(clients.biologist, path, { name: 'fake.png', content: PDF }), 415)
    expectErrorAnswer(await uploadForm(clients.biologist, path, { name: 'binary.txt', content: new Uint8Array([0x41, 0, 0x42]) }), 415)
    expectErrorAnswer(await uploadForm(clients.biologist, path, { name: 'empty.pdf', content: '' }), 422, /empty/)
    expect(await attachmentCount()).toBe(before)
    expect(await attachmentKeys()).toEqual(keysBefore)
    for (const [name, content] of [['photo.JPG', JPEG], ['report.docx', DOCX], ['counts.csv', 'year,adults\n2024,66\n'], ['notes.txt', 'Field notes (invented).\n']] as const) {
      const created = await uploadForm(clients.biologist, path, { name, content })
      expect(created.status, name).toBe(201)
    }
  })

  it('file names: path parts, control characters and reserved characters are removed', async () => {
    const cases: [string, string][] = [
      ['../../../../etc/passwd.txt', 'passwd.txt'],
      ['..\\..\\Windows\\system32\\notes.txt', 'notes.txt'],
      ['.hidden.txt', 'hidden.txt'],
      ['per<mit>:2024?.pdf', 'per_mit__2024_.pdf'],
      ['Écologie du site.pdf', 'Écologie du site.pdf'],
    ]
    for (const [sent, kept] of cases) {
      const created = await uploadForm(clients.biologist, path, { name: sent, content: sent.endsWith('.pdf') ? PDF : 'text' })
      expect(created.status, sent).toBe(201)
      expect(created.body.fileName, sent).toBe(kept)
    }
  })

  it('over 20 MB → 413, at once with Content-Length and mid-stream without; nothing stored', async () => {
    const before = await attachmentCount()
    const keysBefore = await attachmentKeys()
    const declared = await fetch(new URL(path, server.url), {
      method: 'POST',
      headers: { 'content-type': 'multipart/form-data; boundary=x', 'cookie': clients.biologist.cookieHeader },
      body: new Uint8Array(21 * 1024 * 1024 + 70 * 1024),
    })
    expect(declared.status).toBe(413)
    const streamed = await streamLargeUpload(server, clients.biologist, path, 'big.txt', 64 * 1024 * 1024)
    expect(streamed.status).toBe(413)
    expect(streamed.body.message).toMatch(/limit is 20 MB/)
    expect(await attachmentCount()).toBe(before)
    expect(await attachmentKeys()).toEqual(keysBefore)
    expect((await clients.viewer.get(path)).status).toBe(200)
  })

  it('object store down → 503 and no record', async () => {
    const before = await attachmentCount()
    await server.objectStore.stop()
    try {
      expectErrorAnswer(await uploadForm(clients.biologist, path, { name: 'permit.pdf', content: PDF }), 503, /File storage cannot be reached/)
    } finally {
      await server.objectStore.start()
    }
    expect(await attachmentCount()).toBe(before)
  })
})

describe('GET /api/attachments/:id/download', () => {
  it('a presigned link that downloads the bytes under the file name; redirect form; 404 for another agency', async () => {
    const created = await uploadForm(clients.biologist, path, { name: 'Permit 2024.pdf', content: PDF })
    const id = created.body.id as number
    expectErrorAnswer(await clients.anonymous.get(`/api/attachments/${id}/download`), 401)
    expectErrorAnswer(await clients.otherAdmin.get(`/api/attachments/${id}/download`), 404)
    for (const role of ['viewer', 'biologist', 'manager', 'administrator'] as const) {
      const link = await clients[role].get(`/api/attachments/${id}/download`)
      expect(link.status, role).toBe(200)
      expect(link.body.expiresInSeconds).toBe(300)
      expect(link.body.url).toMatch(/X-Amz-Expires=300/)
    }
    const link = await clients.viewer.get(`/api/attachments/${id}/download`)
    const file = await fetch(link.body.url)
    expect(file.status).toBe(200)
    expect(new Uint8Array(await file.arrayBuffer())).toEqual(PDF)
    expect(file.headers.get('content-type')).toBe('application/pdf')
    expect(file.headers.get('content-disposition')).toMatch(/^attachment; filename="Permit 2024.pdf"/)
    const redirect = await clients.viewer.get(`/api/attachments/${id}/download?redirect=true`)
    expect(redirect.status).toBe(302)
    expect(redirect.headers.get('location')).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/tributary\/attachments\//)
  })
})

describe('DELETE /api/attachments/:id', () => {
  it('only its uploader or an administrator; others 403, another agency 404; audit row; file removed', async () => {
    const created = await uploadForm(clients.biologist, path, { name: 'to-delete.pdf', content: PDF })
    const id = created.body.id as number
    const key = (await server.db.query('SELECT storage_key FROM attachments WHERE id = $1', [id])).rows[0].storage_key
    expectErrorAnswer(await clients.anonymous.delete(`/api/attachments/${id}`), 401)
    expectErrorAnswer(await clients.viewer.delete(`/api/attachments/${id}`), 403)
    expectErrorAnswer(await clients.secondBiologist.delete(`/api/attachments/${id}`), 403, /attached this file/)
    expectErrorAnswer(await clients.manager.delete(`/api/attachments/${id}`), 403)
    expectErrorAnswer(await clients.otherAdmin.delete(`/api/attachments/${id}`), 404)
    expect((await server.db.query('SELECT 1 FROM attachments WHERE id = $1', [id])).rowCount).toBe(1)

    expect((await clients.biologist.delete(`/api/attachments/${id}`)).status).toBe(204)
    expect((await server.db.query('SELECT 1 FROM attachments WHERE id = $1', [id])).rowCount).toBe(0)
    expect(await attachmentKeys()).not.toContain(key)
    const audit = await server.db.query(`SELECT action FROM audit_events WHERE entity_type = 'attachment' AND entity_id = $1 ORDER BY id`, [id])
    expect(audit.rows.map(r => r.action)).toEqual(['attachment.upload', 'attachment.delete'])
    expectErrorAnswer(await clients.biologist.delete(`/api/attachments/${id}`), 404)
    expectErrorAnswer(await clients.viewer.get(`/api/attachments/${id}/download`), 404)
  })

  it('an administrator may delete anyone\'s attachment', async () => {
    const created = await uploadForm(clients.secondBiologist, path, { name: 'theirs.txt', content: 'text' })
    expect((await clients.administrator.delete(`/api/attachments/${created.body.id}`)).status).toBe(204)
  })
})
