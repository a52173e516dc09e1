/**
 * The decision block (author, reviewer, approver, dates, comment), how to verify the document,
 * and the governing caution — the last page of every brief.
 */
import type { PdfContent } from '../pdf-types'
import type { BriefBuildOptions, BriefData, BriefPerson } from '../types'
import { formatDateTime } from '../format'
import { DRAFT_MARK, GOVERNING_CAUTION } from './pick'
import { callout, labelled, PALETTE, sectionHeading, subheading } from './style'

function person(who: BriefPerson | null, missing: string): PdfContent {
  if (!who) return { text: missing, style: 'body', color: PALETTE.muted, italics: true }
  return { text: [{ text: who.name, color: PALETTE.ink, bold: true }, ...(who.email ? [{ text: `  ${who.email}`, color: PALETTE.muted, fontSize: 8 }] : [])], style: 'body' }
}

function decisionWords(data: BriefData, options: BriefBuildOptions): string {
  if (options.draft || data.decision.decision === null) return `Not decided yet (${DRAFT_MARK.toLowerCase()})`
  return { approve: 'Approved', return: 'Returned for changes', decline: 'Declined' }[data.decision.decision]
}

/** The decision section. */
export function decisionSection(data: BriefData, options: BriefBuildOptions, number: number): PdfContent[] {
  const decision = data.decision
  const comment = decision.comment?.trim()
  return [
    sectionHeading(number, 'Decision'),
    {
      columns: [
        { stack: [labelled('Author', person(decision.author, '—')), labelled('Submitted for review', formatDateTime(decision.submittedAt))], width: '*' },
        { stack: [labelled('Reviewer', person(decision.reviewer, 'Not assigned')), labelled('Decision', { text: decisionWords(data, options), style: 'body', bold: true, color: options.draft ? PALETTE.ochre600 : PALETTE.river800 })], width: '*' },
        { stack: [labelled('Approved by', person(options.draft ? null : decision.approver, 'Not approved')), labelled('Date of decision', options.draft ? '—' : formatDateTime(decision.decidedAt))], width: '*' },
      ],
      columnGap: 14,
      unbreakable: true,
    },
    labelled('Decision comment', comment && !options.draft ? { text: comment, style: 'body', color: PALETTE.ink } : { text: 'None', style: 'body', color: PALETTE.muted, italics: true }),
  ]
}

/** "Verifying this document" and the caution; ends the document. */
export function closingSection(data: BriefData, options: BriefBuildOptions): PdfContent[] {
  const verification: PdfContent[] = options.draft
    ? [
        { text: `Preview ID ${data.documentId}.`, style: 'body', bold: true, color: PALETTE.ink },
        { text: `This is an unsigned preview. It is not recorded by Tributary and the verify page (${data.verifyUrl}) will not recognise it. The brief is signed and recorded only when the proposal is approved.`, style: 'body' },
      ]
    : [
        { text: `Document ID ${data.documentId}.`, style: 'body', bold: true, color: PALETTE.ink },
        { text: `This file carries a digital signature made with the signing certificate of ${data.agency.name} when the proposal was approved. Changing any byte of the file after signing breaks the signature. To check a copy, upload it at ${data.verifyUrl}: the page says whether the signature is valid, who signed it and when, and whether the file is exactly the one Tributary issued under this document ID.`, style: 'body', margin: [0, 0, 0, 4] },
        { text: 'That last check compares the SHA-256 fingerprint of the uploaded file with the fingerprint Tributary recorded at issue. The fingerprint of the signed file is not printed here, because a file cannot contain its own fingerprint (printing it would change the file and so the fingerprint); it is kept in Tributary\'s register of issued briefs, sent with the e-mail that delivered this brief, and shown by the verify page.', style: 'body' },
      ]
  return [
    subheading('Verifying this document'),
    ...verification,
    callout({ text: [{ text: 'Caution. ', bold: true }, GOVERNING_CAUTION], style: 'body', color: PALETTE.ink }, { fill: PALETTE.band, rule: PALETTE.river600 }),
  ]
}
