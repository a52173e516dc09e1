/**
 * Section 1: the map figure (recipient, sources, arrows, scale, north) and the subpopulation
 * data table (census, working Ne and why, generation time, isolation, environment, distance).
 */
import type { PdfContent } from '../pdf-types'
import type { BriefData, BriefSubpopulation } from '../types'
import { formatNumber } from '../format'
import { briefMapSvg, mapCaption } from '../map-svg'
import { CONTENT_WIDTH, dataTable, paragraph, PALETTE, sectionHeading, subheading } from './style'

const MAP_HEIGHT = 270

function roleText(sub: BriefSubpopulation): PdfContent {
  return sub.role === 'recipient'
    ? { text: 'Recipient', color: PALETTE.ochre600, bold: true }
    : { text: 'Source', color: PALETTE.river800, bold: true }
}

function neText(sub: BriefSubpopulation): string {
  return sub.workingNe === null ? 'not set' : formatNumber(sub.workingNe, 1)
}

/** Section 1 content. */
export function placesSection(data: BriefData, number: number): PdfContent[] {
  const involved = [data.recipient, ...data.sources]
  const svg = briefMapSvg([...involved, ...data.others], { width: CONTENT_WIDTH, height: MAP_HEIGHT })
  const rows = involved.map(sub => [
    { text: sub.name, bold: true, color: PALETTE.ink },
    roleText(sub),
    sub.latestCensus ? `${formatNumber(sub.latestCensus.adults)} (${sub.latestCensus.year})` : '—',
    neText(sub),
    formatNumber(sub.generationTimeYears, 1),
    sub.yearsIsolated === null ? '—' : formatNumber(sub.yearsIsolated, 0),
    sub.areaKm2 === null ? '—' : formatNumber(sub.areaKm2, 1),
    sub.distanceToRecipientKm === null ? '—' : formatNumber(sub.distanceToRecipientKm, 1),
    sub.environmentClass ?? '—',
  ])
  const reasons = involved
    .filter(sub => sub.workingNe !== null && sub.workingNeReason)
    .map(sub => ({ text: [{ text: `${sub.name}: `, bold: true }, sub.workingNeReason ?? ''], style: 'small', margin: [0, 0, 0, 2] }))

  return [
    sectionHeading(number, 'The subpopulations involved', { pageBreak: false }),
    svg
      ? { svg, width: CONTENT_WIDTH, font: 'Inter', margin: [0, 2, 0, 4] }
      : { text: 'No boundary or location is recorded for these subpopulations, so no map can be drawn.', style: 'body', italics: true },
    { text: `Figure 1. ${data.recipient.name} (recipient) and ${data.sources.map(source => source.name).join(', ') || 'no recorded source'}. ${mapCaption(involved)}`, style: 'caption', margin: [0, 0, 0, 10] },
    subheading('Subpopulation records'),
    dataTable(
      ['Subpopulation', 'Role', 'Adults (year)', 'Working Ne', 'Gen. time (y)', 'Isolated (y)', 'Area (km²)', 'To recipient (km)', 'Environment'],
      rows,
      [76, 42, 48, 38, 34, 34, 36, 44, '*'],
      { alignRight: [2, 3, 4, 5, 6, 7], fontSize: 7.8 },
    ),
    ...(data.captiveSource ? [paragraph(`Also proposed as a source: ${data.captiveSource} (not a recorded subpopulation; no figures are shown for it).`)] : []),
    {
      stack: [
        ...(reasons.length ? [{ text: 'Why each working Ne was chosen', style: 'label', margin: [0, 2, 0, 3] }, ...reasons] : []),
        { text: 'Adults: the latest census count on record. Working Ne: the effective size the biologist chose for projections, with the reason they gave (or how it was resolved when none was chosen). Distances are great-circle distances between centroids.', style: 'caption', margin: [0, 4, 0, 0] },
      ],
      unbreakable: true,
    },
  ]
}
