/**
 * Page 1: the agency letterhead, title, species, recipient, sources, date and status, the
 * recommendation in a few sentences, the key figures and the governing caution.
 */
import type { PdfContent } from '../pdf-types'
import type { BriefBuildOptions, BriefData } from '../types'
import { formatDate, formatFitness, formatFixed, formatMigrants, formatProbability } from '../format'
import { baselineScenario, DRAFT_MARK, GOVERNING_CAUTION, recommendedScenario } from './pick'
import { callout, CONTENT_WIDTH, labelled, PALETTE } from './style'

function letterhead(data: BriefData): PdfContent {
  const agency = data.agency
  const contact = [agency.contactEmail, agency.phone].filter((part): part is string => Boolean(part)).join('  ·  ')
  const identity: PdfContent = {
    stack: [
      { text: agency.name, font: 'InterSemiBold', fontSize: 13, color: PALETTE.river900 },
      { text: agency.address, style: 'small', margin: [0, 2, 0, 0] },
      ...(contact ? [{ text: contact, style: 'small' }] : []),
    ],
  }
  const logo: PdfContent[] = agency.logo
    ? [{ image: `data:${agency.logo.contentType};base64,${agency.logo.base64}`, fit: [96, 52], width: 100 }]
    : [{
        // No logo uploaded: the agency's short name in a quiet tile.
        table: { widths: [52], heights: [44], body: [[{ text: agency.shortName, font: 'InterSemiBold', fontSize: agency.shortName.length > 5 ? 9 : 12, color: PALETTE.white, alignment: 'center', margin: [0, 14, 0, 0] }]] },
        layout: { hLineWidth: () => 0, vLineWidth: () => 0, fillColor: () => PALETTE.river800 },
        width: 60,
      }]
  return {
    stack: [
      { columns: [...logo, { ...identity, width: '*', margin: [8, 2, 0, 0] }, { text: 'GENETIC RESCUE BRIEF', style: 'label', color: PALETTE.ochre600, alignment: 'right', width: 130, margin: [0, 4, 0, 0] }] },
      {
        canvas: [
          { type: 'line', x1: 0, y1: 0, x2: CONTENT_WIDTH, y2: 0, lineWidth: 1.6, lineColor: PALETTE.river800 },
          { type: 'line', x1: 0, y1: 0, x2: 72, y2: 0, lineWidth: 1.6, lineColor: PALETTE.ochre500 },
        ],
        margin: [0, 10, 0, 0],
      },
    ],
  }
}

function statusText(data: BriefData, options: BriefBuildOptions): PdfContent {
  if (options.draft) return { text: `${DRAFT_MARK} (preview of ${formatDate(data.issuedAt)})`, style: 'body', color: PALETTE.ochre600, bold: true }
  const approver = data.decision.approver?.name
  return { text: `Approved ${formatDate(data.decision.decidedAt)}${approver ? ` by ${approver}` : ''}; signed by the agency`, style: 'body', color: PALETTE.river800, bold: true }
}

function keyFigure(label: string, value: string, detail: string): PdfContent {
  return {
    stack: [
      { text: label.toUpperCase(), style: 'label' },
      { text: value, style: 'figure', margin: [0, 3, 0, 2] },
      { text: detail, style: 'small' },
    ],
    margin: [0, 0, 8, 0],
  }
}

function keyFigures(data: BriefData): PdfContent | null {
  const chosen = recommendedScenario(data)
  if (!chosen) return null
  const baseline = baselineScenario(data)
  const years = chosen.horizonYears
  const figures: PdfContent[] = [
    keyFigure(`Inbreeding F in ${years} years`, formatFixed(chosen.atHorizon.inbreeding, 3), baseline ? `without action ${formatFixed(baseline.atHorizon.inbreeding, 3)}` : 'expected, from today'),
    keyFigure(`Relative fitness in ${years} years`, formatFitness(chosen.atHorizon.fitness), baseline ? `without action ${formatFitness(baseline.atHorizon.fitness)}` : `2B = ${chosen.diploidLethalEquivalents}`),
    keyFigure('Effective migrants per generation', formatMigrants(chosen.migrantsPerGeneration), 'Ne·m while releases continue; rule of thumb 1–10'),
  ]
  const first = chosen.establishment[0]
  if (first) {
    figures.push(keyFigure('Establishment of the variant', formatProbability(first.overSchedule), `${first.variantName}, over all releases`))
  } else if (data.outbreeding) {
    figures.push(keyFigure('Outbreeding risk', data.outbreeding.level === 'low' ? 'Low' : 'Elevated', 'Frankham et al. (2011) screen'))
  }
  return {
    table: { widths: figures.map(() => '*'), body: [figures] },
    layout: {
      hLineWidth: (index: number) => (index === 0 ? 0.6 : 0.6),
      vLineWidth: () => 0,
      hLineColor: () => PALETTE.rule,
      paddingLeft: () => 0,
      paddingRight: () => 4,
      paddingTop: () => 8,
      paddingBottom: () => 8,
    },
    margin: [0, 4, 0, 10],
  }
}

/** The cover page content (ends with a page break). */
export function coverSection(data: BriefData, options: BriefBuildOptions): PdfContent[] {
  const sources = data.sources.map(source => source.name)
  if (data.captiveSource) sources.push(data.captiveSource)
  const speciesLine: PdfContent = {
    text: [
      { text: data.species.commonName },
      { text: ` (${data.species.scientificName})`, italics: true },
      ...(data.species.invented ? [{ text: ' — invented demo species', color: PALETTE.muted }] : []),
    ],
    style: 'body',
    color: PALETTE.ink,
  }
  const figures = keyFigures(data)
  return [
    letterhead(data),
    { text: data.proposal.title, style: 'title', margin: [0, 28, 0, 6] },
    { text: `A recommendation on gene flow into ${data.recipient.name}`, style: 'subtitle', margin: [0, 0, 0, 18] },
    {
      columns: [
        { stack: [labelled('Species', speciesLine), labelled('Recipient subpopulation', data.recipient.name), labelled(sources.length > 1 ? 'Sources' : 'Source', sources.join(', ') || 'None chosen')], width: '*' },
        { stack: [labelled(options.draft ? 'Preview date' : 'Date of issue', formatDate(data.issuedAt)), labelled('Status', statusText(data, options)), labelled('Reference · document ID', { text: [{ text: `${data.proposal.reference} · ` }, { text: data.documentId, fontSize: 8.5 }], style: 'body', color: PALETTE.ink })], width: '*' },
      ],
      columnGap: 18,
    },
    callout([
      { text: 'Recommendation', font: 'InterSemiBold', fontSize: 11, color: PALETTE.river900, margin: [0, 0, 0, 4] },
      ...data.recommendation.map(sentence => ({ text: sentence, style: 'body', color: PALETTE.ink, margin: [0, 0, 0, 3] })),
    ], { fill: PALETTE.ochre50, rule: PALETTE.ochre500 }),
    {
      stack: [
        ...(figures ? [figures] : []),
        callout([
          { text: [{ text: 'Caution. ', bold: true }, GOVERNING_CAUTION], style: 'small', color: PALETTE.body },
          { text: 'Figures are expectations from population-genetic models, computed by Tributary from the records and assumptions in this brief; sections 4 and 5 give the methods, their assumptions and sources.', style: 'caption', margin: [0, 3, 0, 0] },
        ], { fill: PALETTE.band, rule: PALETTE.river600 }),
      ],
      unbreakable: true,
      pageBreak: 'after',
    },
  ]
}
