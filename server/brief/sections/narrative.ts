/**
 * The author's own words: purpose and rationale (section 1), the outbreeding-depression screen,
 * the monitoring plan, and risks with the permits needed.
 */
import type { PdfContent } from '../pdf-types'
import type { BriefData } from '../types'
import { callout, dataTable, PALETTE, paragraph, sectionHeading, subheading } from './style'

/** Section 1: why this proposal exists. */
export function purposeSection(data: BriefData, number: number): PdfContent[] {
  return [
    sectionHeading(number, 'Purpose and rationale'),
    subheading('Purpose'),
    paragraph(data.narrative.purpose),
    subheading('Rationale'),
    paragraph(data.narrative.rationale),
  ]
}

/** The outbreeding-depression screen (Frankham et al. 2011). */
export function outbreedingSection(data: BriefData, number: number): PdfContent[] {
  const screen = data.outbreeding
  if (!screen) {
    return [
      sectionHeading(number, 'Outbreeding-depression screen'),
      paragraph('The screen has not been answered for this proposal. Until it is, the risk of outbreeding depression is treated as elevated.'),
    ]
  }
  const answerText = (answer: 'yes' | 'no' | 'unknown') => ({ text: answer === 'unknown' ? 'Not known' : answer === 'yes' ? 'Yes' : 'No', bold: true })
  const level = screen.level === 'low'
    ? { text: 'Low predicted risk', colour: PALETTE.river800, fill: PALETTE.river50 }
    : { text: 'Elevated predicted risk', colour: PALETTE.ochre600, fill: PALETTE.ochre50 }
  return [
    sectionHeading(number, 'Outbreeding-depression screen'),
    { text: `Crossing ${screen.sourceName ?? 'the source'} with ${data.recipient.name}: the four questions of the Frankham et al. (2011) decision tree. Any answer that raises the risk, including "not known", makes it elevated.`, style: 'body', margin: [0, 0, 0, 4] },
    {
      stack: [
        dataTable(['Question', 'Answer', 'Note'], screen.answers.map(item => [item.question, answerText(item.answer), item.note || '—']), [180, 50, '*']),
        callout([
          { text: level.text, font: 'InterSemiBold', fontSize: 10, color: level.colour, margin: [0, 0, 0, 3] },
          ...screen.reasons.map(reason => ({ text: reason, style: 'body', margin: [0, 0, 0, 2] })),
          { text: screen.level === 'low' ? 'Crossing can be considered; the usual monitoring applies.' : 'Avoid crossing, or try it only on a limited, experimental basis with test crosses followed into at least the F2 generation. Weigh this against the (usually larger) cost of continued inbreeding.', style: 'small', margin: [0, 2, 0, 0] },
        ], { fill: level.fill, rule: level.colour }),
      ],
      unbreakable: true,
    },
    { text: 'Source: Frankham R, Ballou JD, Eldridge MDB, Lacy RC, Ralls K, Dudash MR, Fenster CB (2011) Predicting the probability of outbreeding depression. Conservation Biology 25: 465–475.', style: 'caption' },
  ]
}

/** Monitoring plan, then risks and permits. */
export function planSections(data: BriefData, firstNumber: number): PdfContent[] {
  return [
    sectionHeading(firstNumber, 'Monitoring plan'),
    paragraph(data.narrative.monitoringPlan),
    sectionHeading(firstNumber + 1, 'Risks and permits'),
    subheading('Risks and how they are reduced'),
    paragraph(data.narrative.risks),
    subheading('Permits and approvals needed'),
    paragraph(data.narrative.permits),
  ]
}
