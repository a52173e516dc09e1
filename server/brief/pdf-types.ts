/**
 * The small part of pdfmake's document-definition vocabulary the brief uses, typed loosely:
 * pdfmake 0.3 ships no TypeScript types. A content node is text, a list of nodes, or an object
 * with pdfmake keys (text, table, columns, svg, image, stack, …).
 */
export type PdfContent = string | PdfContent[] | PdfNode

export interface PdfNode {
  [key: string]: unknown
}

/** A whole document definition as `pdfmake.createPdf` takes it. */
export interface PdfDocumentDefinition {
  info: Record<string, string>
  pageSize: string
  pageMargins: [number, number, number, number]
  defaultStyle: PdfNode
  styles: Record<string, PdfNode>
  content: PdfContent[]
  header?: (currentPage: number, pageCount: number) => PdfContent
  footer?: (currentPage: number, pageCount: number) => PdfContent
  watermark?: PdfNode
  images?: Record<string, string>
  [key: string]: unknown
}
