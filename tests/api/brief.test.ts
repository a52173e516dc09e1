/**
 * The PDF brief end to end against the built server: the demo's approved proposal gets a signed
 * brief that pdfsig and our verify route accept, that carries the key figures (checked against
 * the engine for the same inputs) and the caution, that is stored unchanged and append-only and
 * e-mailed to its author; a draft's preview says "Draft — not approved" on every page and is
 * unsigned; who may fetch what; the agency's certificate and logo routes.
 */
import { createHash } from 'node:crypto'
import { beforeAll, describe, expect, it } from 'vitest'
import { computeScenarioResults } from '../../shared/proposals/results'
import type { ApiClient } from '../support/client'
import { demo, eventually, useServer } from '../support/server'
import { createOtherAgency, expectErrorAnswer, otherAgencyPassword } from './auth-support'
import { getBytes, makeLogoPng, makePkcs12, pageCount, pdfsig, pdftotext, postFile } from './brief-support'
import { createProposal, demoRecords, setProposalStatus } from './proposals-support'

const server = useServer()

const APPROVED_TITLE = 'Gene flow for Owlfeather Bald (demo, approved)'
const DRAFT_TITLE = 'Genetic rescue for Fernwhistle Creek (demo draft)'
const CAUTION = 'Agency policy, permits and licensed practice govern any translocation'

type Role = 'viewer' | 'biologist' | 'manager' | 'administrator'
let clients: Record<Role | 'anonymous' | 'otherAdmin', ApiClient>
let approvedId: number
let draftId: number

async function proposalIdByTitle(title: string): Promise<number> {
  const result = await server.db.query<{ id: number }>('SELECT id FROM proposals WHERE title = $1', [title])
  const row = result.rows[0]
  if (!row) throw new Error(`no proposal "${title}" in the seeded database`)
  return row.id
}

const flat = (text: string) => text.replace(/\s+/g, ' ')

beforeAll(async () => {
  const other = await createOtherAgency(server)
  clients = {
    anonymous: server.anonymous(),
    viewer: await server.signIn(demo.viewer),
    biologist: await server.signIn(demo.biologist),
    manager: await server.signIn(demo.manager),
    administrator: await server.signIn(demo.admin),
    otherAdmin: await server.signIn(other.adminEmail, otherAgencyPassword),
  }
  approvedId = await proposalIdByTitle(APPROVED_TITLE)
  draftId = await proposalIdByTitle(DRAFT_TITLE)
})

describe('the signed brief of an approved proposal', () => {
  let signed: Buffer
  let sha256: string
  let documentId: string

  beforeAll(async () => {
    await server.mail.clear()
    const response = await getBytes(clients.viewer, `/api/proposals/${approvedId}/brief.pdf`)
    expect(response.status, response.bytes.toString('utf8', 0, 300)).toBe(200)
    expect(response.headers.get('content-type')).toBe('application/pdf')
    signed = response.bytes
    sha256 = response.headers.get('x-brief-sha256') ?? ''
    documentId = response.headers.get('x-brief-document-id') ?? ''
  }, 60_000)

  it('is a PDF whose SHA-256 is the one recorded in the register', async () => {
    expect(signed.subarray(0, 5).toString('latin1')).toBe('%PDF-')
    expect(sha256).toBe(createHash('sha256').update(signed).digest('hex'))
    const rows = await server.db.query('SELECT document_id, sha256, size_bytes, pdf FROM issued_briefs WHERE proposal_id = $1', [approvedId])
    expect(rows.rows).toHaveLength(1)
    expect(rows.rows[0].document_id).toBe(documentId)
    expect(rows.rows[0].sha256).toBe(sha256)
    expect(Buffer.compare(rows.rows[0].pdf, signed)).toBe(0)
    expect(rows.rows[0].size_bytes).toBe(signed.length)
  })

  it('is served unchanged every time, to every role of the agency', async () => {
    for (const role of ['viewer', 'biologist', 'manager', 'administrator'] as const) {
      const again = await getBytes(clients[role], `/api/proposals/${approvedId}/brief.pdf?download=1`)
      expect(again.status).toBe(200)
      expect(again.headers.get('content-disposition')).toMatch(/^attachment; filename="EUWS-P-\d+-brief\.pdf"$/)
      expect(Buffer.compare(again.bytes, signed)).toBe(0)
    }
  })

  it('carries a signature that pdfsig finds valid (a self-signed agency certificate: issuer unknown)', () => {
    const report = pdfsig(signed)
    expect(report).toMatch(/Signature Validation: Signature is Valid/)
    expect(report).toMatch(/Signer Certificate Common Name: Eastern Uplands Wildlife Service/)
    expect(report).toMatch(/Total document signed/)
    expect(report).toMatch(/Certificate issuer is unknown|Certificate Validation/)
  })

  it('prints the key figures (the engine\'s, for the same inputs), the document ID and the caution', async () => {
    const detail = (await clients.viewer.get(`/api/proposals/${approvedId}`)).body
    const recommended = detail.scenarios.find((scenario: { id: number }) => scenario.id === detail.proposal.recommendedScenarioId)
      ?? detail.scenarios.find((scenario: { isBaseline: boolean }) => !scenario.isBaseline)
    const baseline = detail.scenarios.find((scenario: { isBaseline: boolean }) => scenario.isBaseline)
    const recipient = {
      census: detail.recipient.latestCensus.adults,
      effectiveSize: detail.recipient.workingNe,
      generationTimeYears: detail.recipient.generationTimeYears,
      initialInbreeding: 0,
    }
    const withAction = computeScenarioResults({ recipient, inputs: recommended.inputs })
    const withoutAction = computeScenarioResults({ recipient, inputs: baseline.inputs })
    const text = flat(pdftotext(signed))
    expect(text).toContain(detail.proposal.title)
    expect(text).toContain(detail.recipient.name)
    expect(text).toContain(recommended.name)
    expect(text).toContain(withAction.projection.atHorizon.inbreedingWith.toFixed(3))
    expect(text).toContain(withoutAction.projection.atHorizon.inbreedingWithout.toFixed(3))
    expect(text).toContain(`Document ID ${documentId}`)
    expect(text).toContain(CAUTION)
    expect(text).not.toContain('Draft — not approved')
    // Every page carries the document ID and its page number.
    const pages = pageCount(signed)
    expect(pages).toBeGreaterThanOrEqual(5)
    for (let page = 1; page <= pages; page++) {
      const pageText = flat(pdftotext(signed, page))
      expect(pageText).toContain(documentId)
      expect(pageText).toContain(`Page ${page} of ${pages}`)
    }
  })

  it('is e-mailed to the author with the PDF attached, and the issue is audited', async () => {
    const mail = await eventually(async () => (await server.mail.messages()).find(message => message.subject.startsWith('Signed brief:') && String(message.to).includes(demo.biologist)))
    expect(mail.text).toContain(sha256)
    expect(mail.text).toContain(documentId)
    expect(mail.attachments).toHaveLength(1)
    expect(mail.attachments[0]).toMatchObject({ contentType: 'application/pdf', size: signed.length })
    expect(mail.attachments[0]?.filename).toMatch(/\.pdf$/)
    const audit = await server.db.query(`SELECT after FROM audit_events WHERE action = 'brief.issue' AND entity_id = $1`, [approvedId])
    expect(audit.rows).toHaveLength(1)
    expect(audit.rows[0].after.sha256).toBe(sha256)
  })

  it('is append-only in the database: an update or a delete of the issued file is refused', async () => {
    await expect(server.db.query('UPDATE issued_briefs SET sha256 = repeat(\'0\', 64) WHERE proposal_id = $1', [approvedId])).rejects.toThrow(/append-only/)
    await expect(server.db.query('DELETE FROM issued_briefs WHERE proposal_id = $1', [approvedId])).rejects.toThrow(/append-only/)
  })

  it('GET /api/proposals/:id/brief reports it as issued, with its SHA-256', async () => {
    const status = await clients.viewer.get(`/api/proposals/${approvedId}/brief`)
    expect(status.status).toBe(200)
    expect(status.body).toMatchObject({ proposalId: approvedId, proposalStatus: 'approved', state: 'issued', issued: { documentId, sha256 } })
  })

  it('POST /api/verify (no sign-in) finds it valid and issued by Tributary; one changed byte makes it invalid', async () => {
    const valid = await postFile(clients.anonymous, '/api/verify', { name: 'brief.pdf', type: 'application/pdf', bytes: signed })
    expect(valid.status).toBe(200)
    expect(valid.body).toMatchObject({ signatureValid: true, signed: true, sha256, issuedByTributary: { documentId, proposalTitle: APPROVED_TITLE, agency: 'Eastern Uplands Wildlife Service' } })
    expect(valid.body.signer).toMatchObject({ commonName: 'Eastern Uplands Wildlife Service', selfSigned: true })
    expect(valid.body.message).toMatch(/^Valid\./)

    // One byte in the middle of the first signed range (page content), flipped.
    const range = /\/ByteRange \[0 (\d+) /.exec(signed.toString('latin1'))
    const at = Math.floor(Number(range?.[1] ?? 2000) / 2)
    const changed = Buffer.from(signed)
    changed[at] = (changed[at] ?? 0) ^ 0x01
    const invalid = await postFile(clients.anonymous, '/api/verify', { name: 'brief.pdf', type: 'application/pdf', bytes: changed })
    expect(invalid.status).toBe(200)
    expect(invalid.body).toMatchObject({ signatureValid: false, signed: true, issuedByTributary: null })
    expect(invalid.body.message).toMatch(/^Not valid/)
    expect(pdfsig(changed)).not.toMatch(/Signature is Valid/)
  })
})

describe('the draft preview of a proposal that is not approved', () => {
  let preview: Buffer

  beforeAll(async () => {
    const response = await getBytes(clients.biologist, `/api/proposals/${draftId}/brief.pdf`)
    expect(response.status).toBe(200)
    expect(response.headers.get('content-disposition')).toMatch(/^inline; filename="EUWS-P-\d+-brief-draft\.pdf"$/)
    preview = response.bytes
  }, 60_000)

  it('says "Draft — not approved" on every page and carries no signature', () => {
    const pages = pageCount(preview)
    expect(pages).toBeGreaterThanOrEqual(5)
    for (let page = 1; page <= pages; page++) expect(flat(pdftotext(preview, page))).toContain('Draft — not approved')
    expect(pdfsig(preview)).toMatch(/does not contain any signatures/)
    expect(flat(pdftotext(preview))).toContain(CAUTION)
  })

  it('is not recorded, and the verify route says it carries no signature', async () => {
    const rows = await server.db.query('SELECT count(*)::int AS n FROM issued_briefs WHERE proposal_id = $1', [draftId])
    expect(rows.rows[0].n).toBe(0)
    const answer = await postFile(clients.anonymous, '/api/verify', { name: 'draft.pdf', type: 'application/pdf', bytes: preview })
    expect(answer.body).toMatchObject({ signatureValid: false, signed: false, issuedByTributary: null })
  })

  it('GET /api/proposals/:id/brief reports a draft', async () => {
    const status = await clients.viewer.get(`/api/proposals/${draftId}/brief`)
    expect(status.body).toMatchObject({ state: 'draft', issued: null, proposalStatus: 'draft' })
  })
})

describe('who may fetch a brief', () => {
  it('anonymous → 401; every role of the agency → 200; another agency → 404', async () => {
    for (const path of [`/api/proposals/${draftId}/brief.pdf`, `/api/proposals/${draftId}/brief`]) {
      expectErrorAnswer(await clients.anonymous.get(path), 401)
      expectErrorAnswer(await clients.otherAdmin.get(path), 404, /Proposal not found/)
    }
    for (const role of ['viewer', 'biologist', 'manager', 'administrator'] as const) {
      expect((await clients[role].get(`/api/proposals/${draftId}/brief`)).status).toBe(200)
    }
    expectErrorAnswer(await clients.otherAdmin.get(`/api/proposals/${approvedId}/brief.pdf`), 404)
  })

  it('a malformed id → 422, an unknown one → 404', async () => {
    expectErrorAnswer(await clients.viewer.get('/api/proposals/abc/brief.pdf'), 422)
    expectErrorAnswer(await clients.viewer.get('/api/proposals/999999/brief.pdf'), 404)
    expectErrorAnswer(await clients.viewer.get(`/api/proposals/${draftId}/brief.pdf?download=yes`), 422)
  })
})

describe('the agency\'s signing certificate and letterhead logo', () => {
  it('GET /api/admin/agency/certificate: administrators only; the demo agency has a generated, self-signed one', async () => {
    expectErrorAnswer(await clients.anonymous.get('/api/admin/agency/certificate'), 401)
    for (const role of ['viewer', 'biologist', 'manager'] as const) expectErrorAnswer(await clients[role].get('/api/admin/agency/certificate'), 403, /needs administrator/)
    const answer = await clients.administrator.get('/api/admin/agency/certificate')
    expect(answer.status).toBe(200)
    expect(answer.body).toMatchObject({ present: true, origin: 'generated', selfSigned: true })
    expect(answer.body.subject).toContain('CN=Eastern Uplands Wildlife Service')
    expect(answer.body.fingerprintSha256).toMatch(/^[0-9a-f]{64}$/)
    expect(JSON.stringify(answer.body)).not.toMatch(/pkcs12|PRIVATE KEY/i)
  })

  it('POST /api/admin/agency/certificate refuses a wrong passphrase, a file without a key, an expired certificate and a non-PKCS#12 (422)', async () => {
    const good = makePkcs12('Upload Test Signing Office', 'right-passphrase')
    const wrong = await postFile(clients.administrator, '/api/admin/agency/certificate', { name: 'agency.p12', type: 'application/x-pkcs12', bytes: good }, { passphrase: 'wrong-passphrase' })
    expectErrorAnswer(wrong, 422, /passphrase/)
    const keyless = makePkcs12('Keyless Office', 'pw', {}, { withKey: false })
    expectErrorAnswer(await postFile(clients.administrator, '/api/admin/agency/certificate', { name: 'agency.p12', type: 'application/x-pkcs12', bytes: keyless }, { passphrase: 'pw' }), 422, /private key/)
    const expired = makePkcs12('Expired Office', 'pw', { from: new Date('2020-01-01'), to: new Date('2021-01-01') })
    expectErrorAnswer(await postFile(clients.administrator, '/api/admin/agency/certificate', { name: 'agency.p12', type: 'application/x-pkcs12', bytes: expired }, { passphrase: 'pw' }), 422, /expired/)
    expectErrorAnswer(await postFile(clients.administrator, '/api/admin/agency/certificate', { name: 'agency.p12', type: 'application/x-pkcs12', bytes: Buffer.from('not a certificate at all') }, { passphrase: 'pw' }), 422, /PKCS#12/)
    expectErrorAnswer(await postFile(clients.manager, '/api/admin/agency/certificate', { name: 'agency.p12', type: 'application/x-pkcs12', bytes: good }, { passphrase: 'right-passphrase' }), 403)
    expectErrorAnswer(await postFile(clients.administrator, '/api/admin/agency/certificate', { name: 'agency.p12', type: 'application/x-pkcs12', bytes: Buffer.alloc(70 * 1024, 0x30) }, { passphrase: 'pw' }), 413)
    const still = await clients.administrator.get('/api/admin/agency/certificate')
    expect(still.body.origin).toBe('generated')
  })

  it('an uploaded certificate signs the briefs issued after it (another agency\'s administrator changes only their own)', async () => {
    const pkcs12 = makePkcs12('Western Basin Signing Desk', 'basin-passphrase')
    const uploaded = await postFile(clients.otherAdmin, '/api/admin/agency/certificate', { name: 'west.pfx', type: 'application/x-pkcs12', bytes: pkcs12 }, { passphrase: 'basin-passphrase' })
    expect(uploaded.status, JSON.stringify(uploaded.body)).toBe(200)
    expect(uploaded.body).toMatchObject({ present: true, origin: 'uploaded', subject: expect.stringContaining('CN=Western Basin Signing Desk') })
    expect((await clients.administrator.get('/api/admin/agency/certificate')).body.origin).toBe('generated')

    const good = makePkcs12('Eastern Uplands Signing Desk', 'east-passphrase')
    const mine = await postFile(clients.administrator, '/api/admin/agency/certificate', { name: 'east.p12', type: 'application/x-pkcs12', bytes: good }, { passphrase: 'east-passphrase' })
    expect(mine.status, JSON.stringify(mine.body)).toBe(200)
    const audit = await server.db.query(`SELECT count(*)::int AS n FROM audit_events WHERE action = 'agency.certificate.upload'`)
    expect(audit.rows[0].n).toBe(2)

    const records = await demoRecords(server)
    const created = await createProposal(clients.biologist, { title: 'Brief signing check (test)', recipientId: records.fernwhistle, sourceSubpopulationIds: [records.lanternmoss] })
    await setProposalStatus(server, created.proposal.id, 'approved')
    const brief = await getBytes(clients.manager, `/api/proposals/${created.proposal.id}/brief.pdf`)
    expect(brief.status).toBe(200)
    expect(pdfsig(brief.bytes)).toMatch(/Signer Certificate Common Name: Eastern Uplands Signing Desk[\s\S]*Signature is Valid/)
    const verified = await postFile(clients.anonymous, '/api/verify', { name: 'b.pdf', type: 'application/pdf', bytes: brief.bytes })
    expect(verified.body).toMatchObject({ signatureValid: true, signer: { commonName: 'Eastern Uplands Signing Desk' }, issuedByTributary: { proposalTitle: 'Brief signing check (test)' } })
  })

  it('POST /api/admin/agency/logo stores a PNG for the letterhead; refuses other types (415), files over 1 MB (413) and other roles (403)', async () => {
    const logo = makeLogoPng()
    expectErrorAnswer(await postFile(clients.manager, '/api/admin/agency/logo', { name: 'logo.png', type: 'image/png', bytes: logo }), 403)
    expectErrorAnswer(await postFile(clients.administrator, '/api/admin/agency/logo', { name: 'logo.gif', type: 'image/gif', bytes: Buffer.from('GIF89a....') }), 415)
    expectErrorAnswer(await postFile(clients.administrator, '/api/admin/agency/logo', { name: 'logo.png', type: 'image/png', bytes: Buffer.from('not really a png file') }), 415)
    expectErrorAnswer(await postFile(clients.administrator, '/api/admin/agency/logo', { name: 'logo.png', type: 'image/png', bytes: makeLogoPng(96, 48, 1024 * 1024 + 10) }), 413)
    const stored = await postFile(clients.administrator, '/api/admin/agency/logo', { name: 'logo.png', type: 'image/png', bytes: logo })
    expect(stored.status, JSON.stringify(stored.body)).toBe(200)
    expect(stored.body).toMatchObject({ present: true, contentType: 'image/png', sizeBytes: logo.length, sha256: createHash('sha256').update(logo).digest('hex') })
    const back = await getBytes(clients.administrator, '/api/admin/agency/logo')
    expect(Buffer.compare(back.bytes, logo)).toBe(0)
    expectErrorAnswer(await clients.biologist.get('/api/admin/agency/logo'), 403)
    // The next preview carries the logo as an image on its letterhead.
    const preview = await getBytes(clients.biologist, `/api/proposals/${draftId}/brief.pdf`)
    expect(preview.bytes.toString('latin1')).toMatch(/\/Subtype \/Image/)
  })
})
