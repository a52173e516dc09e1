/**
 * The brief as a pdfmake document definition, from a `BriefData` object alone (no database, no
 * clock, no network): the same data gives the same document. Charts and the map are drawn here
 * as SVG (ECharts server rendering, ./map-svg.ts).
 *
 * Layout: a cover page (letterhead, title, recommendation, key figures, caution), then
 * numbered sections — purpose and rationale, the subpopulations involved (map and table),
 * scenarios compared (table and charts), establishment and rescue results, methods and
 * sources, the outbreeding screen, the monitoring plan, risks and permits, the decision —
 * and a closing block on verification with the governing caution. Every page carries the
 * document ID and "page X of Y"; a draft carries "Draft — not approved" in its header and as
 * a watermark on every page.
 */
import type { PdfContent, PdfDocumentDefinition } from './pdf-types'
import type { BriefBuildOptions, BriefData } from './types'
import { formatDate } from './format'
import { coverSection } from './sections/cover'
import { closingSection, decisionSection } from './sections/decision'
import { outbreedingSection, planSections, purposeSection } from './sections/narrative'
import { DRAFT_MARK } from './sections/pick'
import { placesSection } from './sections/places'
import { methodsSection, resultsSection } from './sections/results'
import { scenariosSection } from './sections/scenarios'
import { PAGE, PALETTE, STYLES } from './sections/style'

/** Longest proposal title shown in the running header. */
const HEADER_TITLE_LENGTH = 70

function shorten(text: string, length: number): string {
  return text.length <= length ? text : `${text.slice(0, length - 1).trimEnd()}…`
}

function header(data: BriefData, options: BriefBuildOptions) {
  return (currentPage: number): PdfContent => {
    const right: PdfContent = options.draft
      ? { text: DRAFT_MARK, font: 'InterSemiBold', fontSize: 9, color: PALETTE.ochre600, alignment: 'right' }
      : { text: `Approved ${formatDate(data.decision.decidedAt)}`, fontSize: 7.5, color: PALETTE.muted, alignment: 'right' }
    const left: PdfContent = currentPage === 1
      ? { text: '' }
      : { text: `${data.agency.shortName} · ${shorten(data.proposal.title, HEADER_TITLE_LENGTH)}`, fontSize: 7.5, color: PALETTE.muted }
    if (currentPage === 1 && !options.draft) return { text: '' }
    return { columns: [{ ...left, width: '*' }, { ...right, width: 150 }], margin: [PAGE.marginX, 26, PAGE.marginX, 0] }
  }
}

function footer(data: BriefData, options: BriefBuildOptions) {
  return (currentPage: number, pageCount: number): PdfContent => ({
    columns: [
      { text: `${options.draft ? 'Preview' : 'Document'} ID ${data.documentId}`, fontSize: 7, color: PALETTE.muted, width: '*' },
      { text: `Page ${currentPage} of ${pageCount}`, fontSize: 7.5, color: PALETTE.muted, alignment: 'right', width: 90 },
    ],
    margin: [PAGE.marginX, 22, PAGE.marginX, 0],
  })
}

/** Rows above which a table is not glued to the heading before it (it may span pages). */
const LONG_TABLE_ROWS = 8

function isHeading(node: PdfContent): boolean {
  return typeof node === 'object' && !Array.isArray(node) && typeof node.headlineLevel === 'number'
}

function isLongTable(node: PdfContent): boolean {
  if (typeof node !== 'object' || Array.isArray(node)) return false
  const table = node.table as { body?: unknown[] } | undefined
  return Array.isArray(table?.body) && table.body.length > LONG_TABLE_ROWS
}

/**
 * Keeps every heading on the same page as what follows it: a run of headings and the first
 * block after them become one unbreakable stack (a long table is left free to span pages).
 * One pass, unlike pdfmake's `pageBreakBefore`, which lays the document out again for every
 * page break it moves.
 */
export function keepHeadingsWithNext(content: readonly PdfContent[]): PdfContent[] {
  const flat = content.flat(Infinity as 1) as PdfContent[]
  const out: PdfContent[] = []
  let index = 0
  while (index < flat.length) {
    const node = flat[index] as PdfContent
    if (!isHeading(node)) {
      out.push(node)
      index += 1
      continue
    }
    const group: PdfContent[] = []
    while (index < flat.length && isHeading(flat[index] as PdfContent)) group.push(flat[index++] as PdfContent)
    const next = flat[index]
    if (next !== undefined && !isLongTable(next)) {
      group.push(next)
      index += 1
    }
    out.push({ stack: group, unbreakable: true })
  }
  return out
}

/**
 * Builds the document definition of a brief.
 *
 * @param data - everything the brief shows (see ./types.ts)
 * @param options.draft - true for a preview before approval: marked "Draft — not approved"
 *   on every page and never signed
 * @returns a pdfmake document definition (fonts 'Inter' and 'InterSemiBold' must be registered)
 */
export function buildBriefDocument(data: BriefData, options: BriefBuildOptions): PdfDocumentDefinition {
  let section = 0
  const next = () => ++section
  const content: PdfContent[] = [
    ...coverSection(data, options),
    ...purposeSection(data, next()),
    ...placesSection(data, next()),
    ...scenariosSection(data, next()),
    ...resultsSection(data, next()),
    ...methodsSection(data, next()),
    ...outbreedingSection(data, next()),
    ...planSections(data, next()),
  ]
  next() // planSections used two numbers
  // The decision, how to verify and the caution stay together on the last page.
  content.push({ stack: [...decisionSection(data, options, next()), ...closingSection(data, options)], unbreakable: true })

  return {
    info: {
      title: data.proposal.title,
      author: data.agency.name,
      subject: `Genetic rescue brief for ${data.recipient.name}${options.draft ? ` (${DRAFT_MARK})` : ''}`,
      keywords: `Tributary; document ${data.documentId}`,
      creator: 'Tributary',
      producer: 'Tributary',
    },
    pageSize: 'A4',
    pageMargins: [PAGE.marginX, PAGE.marginTop, PAGE.marginX, PAGE.marginBottom],
    defaultStyle: { font: 'Inter', fontSize: 9.5, color: PALETTE.body },
    styles: STYLES,
    header: header(data, options),
    footer: footer(data, options),
    ...(options.draft
      ? { watermark: { text: DRAFT_MARK, font: 'InterSemiBold', color: PALETTE.ochre500, opacity: 0.13, fontSize: 58 } }
      : {}),
    content: keepHeadingsWithNext(content),
  }
}
