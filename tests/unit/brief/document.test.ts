/**
 * The document definition and the rendered PDF of the demo brief: every section is there, a
 * draft says "Draft — not approved" in the header of every page and as a watermark, the caution
 * and the document ID print, Greek letters and subscripts survive (full Inter fonts), and the
 * signature placeholder is only added when asked. Text is read back with poppler's pdftotext.
 */
import { execFileSync } from 'node:child_process'
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { beforeAll, describe, expect, it } from 'vitest'
import { assembleBriefData } from '../../../server/brief/assemble'
import { buildBriefDocument, keepHeadingsWithNext } from '../../../server/brief/document'
import { renderPdf } from '../../../server/brief/render'
import { demoBriefRecords, testFonts } from './demo-records'

function pdfText(pdf: Buffer, page?: number): string {
  const directory = mkdtempSync(join(tmpdir(), 'brief-unit-'))
  const path = join(directory, 'brief.pdf')
  writeFileSync(path, pdf)
  try {
    const range = page ? ['-f', String(page), '-l', String(page)] : []
    return execFileSync('pdftotext', [...range, path, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ')
  } finally {
    rmSync(directory, { recursive: true, force: true })
  }
}

function pages(pdf: Buffer): number {
  return (pdf.toString('latin1').match(/\/Type \/Page\b/g) ?? []).length
}

const data = assembleBriefData(demoBriefRecords())

describe('buildBriefDocument', () => {
  it('has the nine numbered sections in order', () => {
    const text = JSON.stringify(buildBriefDocument(data, { draft: false }).content)
    const titles = ['Purpose and rationale', 'The subpopulations involved', 'Scenarios compared', 'Establishment and rescue results', 'Methods, assumptions and sources', 'Outbreeding-depression screen', 'Monitoring plan', 'Risks and permits', 'Decision']
    let last = -1
    titles.forEach((title, index) => {
      const at = text.indexOf(`"SECTION ${index + 1}"`)
      expect(at, title).toBeGreaterThan(last)
      expect(text.indexOf(title, at)).toBeGreaterThan(at)
      last = at
    })
  })

  it('marks a draft with a watermark and an approved brief without one', () => {
    expect(buildBriefDocument(data, { draft: true }).watermark).toMatchObject({ text: 'Draft — not approved' })
    expect(buildBriefDocument(data, { draft: false }).watermark).toBeUndefined()
  })

  it('keeps each heading together with the block after it', () => {
    const heading = { text: 'H', headlineLevel: 1 }
    const sub = { text: 'h', headlineLevel: 2 }
    const body = { text: 'body' }
    const longTable = { table: { body: Array.from({ length: 12 }, () => ['x']) } }
    expect(keepHeadingsWithNext([heading, [sub, body], body])).toEqual([{ stack: [heading, sub, body], unbreakable: true }, body])
    expect(keepHeadingsWithNext([heading, longTable])).toEqual([{ stack: [heading], unbreakable: true }, longTable])
  })
})

describe('the rendered brief', () => {
  let fonts: Awaited<ReturnType<typeof testFonts>>
  let final: Buffer
  let draft: Buffer

  beforeAll(async () => {
    fonts = await testFonts()
    final = await renderPdf(buildBriefDocument(data, { draft: false }), fonts)
    draft = await renderPdf(buildBriefDocument(data, { draft: true }), fonts)
  }, 60_000)

  it('prints the title, the recommendation, the figures, the document ID and the caution', () => {
    const text = pdfText(final)
    expect(text).toContain('Genetic rescue for Fernwhistle Creek')
    expect(text).toContain(`Document ID ${data.documentId}`)
    expect(text).toContain('Agency policy, permits and licensed practice govern any translocation')
    expect(text).toContain((data.scenarios[2]?.atHorizon.inbreeding ?? Number.NaN).toFixed(3))
    expect(text).toContain('Figure 1.')
    expect(text).toContain('Figure 2.')
    expect(text).not.toContain('Draft — not approved')
  })

  it('prints Greek letters, subscripts and symbols with the embedded Inter fonts', () => {
    const text = pdfText(final)
    for (const fragment of ['Ne·m', 'u(p) = ∫₀ᵖ G(x)dx', 'ψ(x)', 'P₁', '≤ 2000']) expect(text, fragment).toContain(fragment)
    expect(final.toString('latin1')).toMatch(/\/FontName \/[A-Z]{6}\+Inter/)
  })

  it('says "Draft — not approved" on every page of a draft, with the preview ID', () => {
    const count = pages(draft)
    expect(count).toBeGreaterThanOrEqual(5)
    for (let page = 1; page <= count; page++) {
      const text = pdfText(draft, page)
      expect(text, `page ${page}`).toContain('Draft — not approved')
      expect(text, `page ${page}`).toContain(`Page ${page} of ${count}`)
      expect(text, `page ${page}`).toContain(`Preview ID ${data.documentId}`)
    }
  })

  it('adds a signature field only when asked', async () => {
    expect(final.toString('latin1')).not.toContain('/ByteRange')
    const withField = await renderPdf(buildBriefDocument(data, { draft: false }), fonts, { reason: 'r', name: 'n', location: 'l', contactInfo: 'c', signingTime: new Date('2026-03-14T15:30:00Z') })
    expect(withField.toString('latin1')).toMatch(/\/ByteRange \[0 \/\*{10} \/\*{10} \/\*{10}\]/)
  }, 30_000)
})
