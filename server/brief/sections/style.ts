/**
 * The brief's look: colours from the design tokens (tailwind.config.ts), text styles, and small
 * builders for headings, paragraphs, key-value rows and tables, so every section reads alike.
 */
import type { PdfContent, PdfNode } from '../pdf-types'

export const PALETTE = {
  river900: '#173f42',
  river800: '#194c4e',
  river600: '#1f7576',
  river100: '#d3f1ef',
  river50: '#eefaf9',
  ochre600: '#b56b18',
  ochre500: '#d38c20',
  ochre100: '#f9edcb',
  ochre50: '#fdf8ec',
  ink: '#1e293b',
  body: '#334155',
  muted: '#64748b',
  rule: '#cbd5e1',
  band: '#f1f5f9',
  white: '#ffffff',
} as const

/** A4, in points. */
export const PAGE = { width: 595.28, height: 841.89, marginX: 54, marginTop: 62, marginBottom: 58 } as const
/** Usable width between the side margins. */
export const CONTENT_WIDTH = PAGE.width - 2 * PAGE.marginX

export const STYLES: Record<string, PdfNode> = {
  title: { font: 'InterSemiBold', fontSize: 24, color: PALETTE.river900, lineHeight: 1.1 },
  subtitle: { fontSize: 12, color: PALETTE.body, lineHeight: 1.3 },
  sectionNumber: { font: 'InterSemiBold', fontSize: 9, color: PALETTE.ochre600, characterSpacing: 0.6 },
  h1: { font: 'InterSemiBold', fontSize: 15, color: PALETTE.river900, margin: [0, 2, 0, 8] },
  h2: { font: 'InterSemiBold', fontSize: 11, color: PALETTE.river800, margin: [0, 10, 0, 4] },
  body: { fontSize: 9.5, color: PALETTE.body, lineHeight: 1.35 },
  small: { fontSize: 8, color: PALETTE.muted, lineHeight: 1.3 },
  caption: { fontSize: 7.8, color: PALETTE.muted, italics: true, lineHeight: 1.3 },
  label: { fontSize: 7.5, color: PALETTE.muted, characterSpacing: 0.3 },
  tableHeader: { font: 'InterSemiBold', fontSize: 8, color: PALETTE.river900, fillColor: PALETTE.river50 },
  tableCell: { fontSize: 8.2, color: PALETTE.body },
  figure: { font: 'InterSemiBold', fontSize: 17, color: PALETTE.river900 },
}

/**
 * A numbered section heading. `headlineLevel` marks it for `keepHeadingsWithNext`
 * (../document.ts), which keeps it on the same page as the block after it.
 */
export function sectionHeading(number: number, title: string, options: { pageBreak?: boolean } = {}): PdfContent {
  return {
    stack: [
      { text: `SECTION ${number}`, style: 'sectionNumber' },
      { text: title, style: 'h1' },
    ],
    headlineLevel: 1,
    ...(options.pageBreak ? { pageBreak: 'before' } : {}),
    margin: [0, options.pageBreak ? 0 : 14, 0, 0],
  }
}

export function subheading(text: string): PdfContent {
  return { text, style: 'h2', headlineLevel: 2 }
}

/** A body paragraph; an empty text prints as "Not stated in the proposal." in grey. */
export function paragraph(text: string, margin: [number, number, number, number] = [0, 0, 0, 6]): PdfContent {
  const trimmed = text.trim()
  if (!trimmed) return { text: 'Not stated in the proposal.', style: 'body', color: PALETTE.muted, italics: true, margin }
  return trimmed.split(/\n\s*\n/).map(part => ({ text: part.trim(), style: 'body', margin }))
}

/** Table layout: light rules between rows, none at the sides. */
export const TABLE_LAYOUT = {
  hLineWidth: (index: number, node: { table: { body: unknown[] } }) => (index === 0 || index === node.table.body.length ? 0.8 : 0.4),
  vLineWidth: () => 0,
  hLineColor: (index: number) => (index <= 1 ? PALETTE.river600 : PALETTE.rule),
  paddingLeft: () => 5,
  paddingRight: () => 5,
  paddingTop: () => 3.5,
  paddingBottom: () => 3.5,
}

/** A data table with a header row; `widths` as pdfmake takes them. */
export function dataTable(header: string[], rows: PdfContent[][], widths: (number | string)[], options: { alignRight?: number[], fontSize?: number } = {}): PdfContent {
  const right = new Set(options.alignRight ?? [])
  const headerRow = header.map((text, index) => ({ text, style: 'tableHeader', alignment: right.has(index) ? 'right' : 'left' }))
  const bodyRows = rows.map(row => row.map((cell, index) => {
    const base = typeof cell === 'string' ? { text: cell } : cell
    return { style: 'tableCell', ...(options.fontSize ? { fontSize: options.fontSize } : {}), ...(right.has(index) ? { alignment: 'right' } : {}), ...(base as PdfNode) }
  }))
  return {
    table: { headerRows: 1, dontBreakRows: true, widths, body: [headerRow, ...bodyRows] },
    layout: TABLE_LAYOUT,
    margin: [0, 2, 0, 8],
  }
}

/** A tinted box around content (recommendation, caution). */
export function callout(content: PdfContent, colours: { fill: string, rule: string }): PdfContent {
  return {
    table: { widths: ['*'], body: [[{ stack: Array.isArray(content) ? content : [content], margin: [10, 8, 10, 6] }]] },
    layout: {
      hLineWidth: () => 0,
      vLineWidth: (index: number) => (index === 0 ? 3 : 0),
      vLineColor: () => colours.rule,
      fillColor: () => colours.fill,
      paddingLeft: () => 0,
      paddingRight: () => 0,
      paddingTop: () => 0,
      paddingBottom: () => 0,
    },
    margin: [0, 4, 0, 10],
  }
}

/** Label above a value (cover facts, decision block). */
export function labelled(label: string, value: PdfContent): PdfContent {
  return { stack: [{ text: label.toUpperCase(), style: 'label', margin: [0, 0, 0, 1.5] }, typeof value === 'string' ? { text: value, style: 'body', color: PALETTE.ink } : value], margin: [0, 0, 0, 7] }
}
