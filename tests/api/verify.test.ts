/**
 * POST /api/verify — the public check of an uploaded PDF: no sign-in needed, bad input answered
 * in plain words (not a PDF → 422, too large → 413 before the rest is read, no file → 422, not
 * multipart → 415), and a signature made elsewhere (valid, but not issued here) told apart from
 * a brief Tributary issued. The issued-brief cases are in brief.test.ts.
 */
import { readFile } from 'node:fs/promises'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { assembleBriefData } from '../../server/brief/assemble'
import { buildBriefDocument } from '../../server/brief/document'
import { ensureBriefFonts } from '../../server/brief/fonts'
import { renderPdf } from '../../server/brief/render'
import { signPdf } from '../../server/utils/signing'
import { demoBriefRecords } from '../unit/brief/demo-records'
import { useServer } from '../support/server'
import { expectErrorAnswer } from './auth-support'
import { makePkcs12, postFile } from './brief-support'

const server = useServer()
const fontDirectory = fileURLToPath(new URL('../../server/assets/fonts/', import.meta.url))

describe('POST /api/verify', () => {
  it('needs no sign-in and says so when the PDF carries no signature', async () => {
    const pdf = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n', 'latin1')
    const answer = await postFile(server.anonymous(), '/api/verify', { name: 'plain.pdf', type: 'application/pdf', bytes: pdf })
    expect(answer.status).toBe(200)
    expect(answer.body).toMatchObject({ signatureValid: false, signed: false, signer: null, signedAt: null, issuedByTributary: null })
    expect(answer.body.sha256).toMatch(/^[0-9a-f]{64}$/)
    expect(answer.body.message).toMatch(/no digital signature/)
  })

  it('a brief signed with another certificate is valid but not issued here', async () => {
    const fonts = await ensureBriefFonts(name => readFile(`${fontDirectory}${name}`))
    const data = assembleBriefData(demoBriefRecords())
    const signingTime = new Date()
    const unsigned = await renderPdf(buildBriefDocument(data, { draft: false }), fonts, { reason: 'Test', name: 'Elsewhere', location: 'Nowhere', contactInfo: '', signingTime })
    const signed = await signPdf(unsigned, makePkcs12('Somewhere Else Agency', 'pw'), 'pw', signingTime)
    const answer = await postFile(server.anonymous(), '/api/verify', { name: 'other.pdf', type: 'application/pdf', bytes: signed.pdf })
    expect(answer.status).toBe(200)
    expect(answer.body).toMatchObject({ signatureValid: true, signed: true, issuedByTributary: null, sha256: signed.sha256, signer: { commonName: 'Somewhere Else Agency', selfSigned: true } })
    expect(new Date(answer.body.signedAt).getTime()).toBeCloseTo(Math.floor(signingTime.getTime() / 1000) * 1000, -4)
    expect(answer.body.message).toMatch(/does not match any brief issued by this Tributary server/)
    const appended = Buffer.concat([signed.pdf, Buffer.from('\n% appended after signing\n')])
    const later = await postFile(server.anonymous(), '/api/verify', { name: 'other.pdf', type: 'application/pdf', bytes: appended })
    expect(later.body).toMatchObject({ signatureValid: false, signed: true })
    expect(later.body.message).toMatch(/added to the file after it was signed/)
  }, 60_000)

  it('refuses a file that is not a PDF (422), whatever its name', async () => {
    for (const name of ['brief.pdf', 'notes.txt']) {
      expectErrorAnswer(await postFile(server.anonymous(), '/api/verify', { name, type: 'application/pdf', bytes: Buffer.from('just some text, not a PDF') }), 422, /not a PDF/)
    }
  })

  it('refuses a file over 10 MB with 413, without reading it all', async () => {
    const big = Buffer.alloc(10 * 1024 * 1024 + 1024, 0x20)
    big.write('%PDF-1.7\n', 0, 'latin1')
    expectErrorAnswer(await postFile(server.anonymous(), '/api/verify', { name: 'big.pdf', type: 'application/pdf', bytes: big }), 413, /10 MB/)
  })

  it('answers 422 without a file and 415 for a body that is not multipart', async () => {
    const form = new FormData()
    form.append('note', 'no file here')
    expectErrorAnswer(await server.anonymous().request('POST', '/api/verify', form), 422, /Choose a file/)
    expectErrorAnswer(await server.anonymous().post('/api/verify', { file: 'x' }), 415, /multipart/)
  })
})
