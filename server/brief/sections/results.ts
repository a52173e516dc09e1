/**
 * Section 4: establishment of the adaptive variants and the expected rescue (inbreeding,
 * heterozygosity, fitness) per scenario against the baseline. Section 5: the methods behind
 * them, their assumptions, the cautions that apply, and the sources.
 */
import type { PdfContent } from '../pdf-types'
import type { BriefData, BriefScenario } from '../types'
import { formatChange, formatFixed, formatNumber, formatProbability, formatYears } from '../format'
import { baselineScenario } from './pick'
import { dataTable, PALETTE, paragraph, sectionHeading, subheading } from './style'

function establishmentTable(scenarios: readonly BriefScenario[]): PdfContent {
  const rows: PdfContent[][] = []
  for (const scenario of scenarios) {
    for (const item of scenario.establishment) {
      rows.push([
        { text: scenario.name, bold: scenario.recommended, color: scenario.recommended ? PALETTE.ochre600 : PALETTE.ink },
        { stack: [item.variantName, { text: `q = ${formatNumber(item.sourceFrequency, 3)}, s = ${formatNumber(item.s, 4)}, h = ${formatNumber(item.h, 2)}`, fontSize: 7, color: PALETTE.muted }] },
        `${formatNumber(item.meanCopiesPerRelease, 1)} × ${formatNumber(item.releasesCounted)}`,
        formatProbability(item.perRelease),
        { stack: [{ text: formatProbability(item.overSchedule), bold: true }, { text: `${formatProbability(item.range.low)} – ${formatProbability(item.range.high)}`, fontSize: 7, color: PALETTE.muted }], alignment: 'right' },
        item.meanTimeYears === null ? '—' : `${formatYears(item.meanTimeYears)} y`,
        { text: item.method, fontSize: 7 },
      ])
    }
  }
  if (rows.length === 0) return paragraph('No adaptive variant is named in these scenarios, so no establishment probability is computed.')
  return dataTable(
    ['Scenario', 'Variant', 'Copies × releases', 'One release', 'All releases (range)', 'Mean time', 'Method'],
    rows,
    [58, '*', 52, 44, 66, 40, 70],
    { alignRight: [2, 3, 4, 5], fontSize: 7.8 },
  )
}

function rescueTable(data: BriefData): PdfContent {
  const baseline = baselineScenario(data)
  const rows = data.scenarios.map(scenario => [
    { text: scenario.name, bold: scenario.recommended, color: scenario.recommended ? PALETTE.ochre600 : PALETTE.ink },
    `${formatNumber(scenario.recipientEffectiveSize, 1)} / ${formatNumber(scenario.recipientCensus)}`,
    `${formatNumber(scenario.generationTimeYears, 1)} y`,
    `${formatNumber(scenario.diploidLethalEquivalents, 2)}`,
    formatFixed(scenario.atHorizon.inbreeding, 3),
    formatFixed(scenario.atHorizon.heterozygosity, 3),
    formatFixed(scenario.atHorizon.fitness, 3),
    baseline && !scenario.isBaseline ? formatChange(scenario.atHorizon.fitness, baseline.atHorizon.fitness) : '—',
  ])
  return dataTable(
    ['Scenario', 'Ne / N', 'Gen. time', '2B', 'F', 'H', 'W', 'W vs no action'],
    rows,
    ['*', 62, 46, 34, 40, 40, 40, 62],
    { alignRight: [1, 2, 3, 4, 5, 6, 7], fontSize: 7.8 },
  )
}

/** Section 4 content. */
export function resultsSection(data: BriefData, number: number): PdfContent[] {
  const notes = data.scenarios.flatMap(scenario => scenario.notes.map(note => ({ text: [{ text: `${scenario.name}. `, bold: true, color: PALETTE.ink }, note], style: 'small' })))
  const horizons = [...new Set(data.scenarios.map(scenario => scenario.horizonYears))]
  return [
    sectionHeading(number, 'Establishment and rescue results'),
    subheading('Establishment of adaptive variants'),
    { text: 'The chance that copies of a favoured variant carried by the released animals spread to fixation in the recipient rather than being lost by drift. It is small even for strongly favoured variants, because most new copies are lost in the first generations.', style: 'body', margin: [0, 0, 0, 4] },
    establishmentTable(data.scenarios),
    { text: 'Copies: mean gene copies of the variant one release carries (2k·q for k animals). All releases: the chance that at least one release establishes it, with the range over the plausible s and h. Mean time: years from the first release to establishment, given that it happens.', style: 'caption', margin: [0, 0, 0, 6] },
    subheading(`Inbreeding, diversity and fitness at the horizon (${horizons.map(h => `${h} years`).join(', ')})`),
    rescueTable(data),
    { text: 'Ne / N: effective size and census of the recipient used (from the record unless the scenario sets a what-if value). 2B: diploid lethal equivalents. W vs no action: the change in expected fitness relative to the baseline at the horizon.', style: 'caption', margin: [0, 0, 0, 6] },
    ...(notes.length
      ? [subheading('Notes on these results'), { ul: notes, margin: [0, 0, 0, 6] }]
      : []),
  ]
}

/** Section 5 content. */
export function methodsSection(data: BriefData, number: number): PdfContent[] {
  const sources = [...new Set(data.methods.flatMap(method => method.sources))].sort()
  return [
    sectionHeading(number, 'Methods, assumptions and sources'),
    ...data.methods.flatMap(method => [
      { text: method.title, font: 'InterSemiBold', fontSize: 9.5, color: PALETTE.river800, margin: [0, 5, 0, 2], headlineLevel: 3 },
      { text: method.text, style: 'body', margin: [0, 0, 0, 2] },
      ...(method.formula ? [{ text: method.formula, fontSize: 8.5, color: PALETTE.ink, margin: [10, 1, 0, 3] }] : []),
      ...(method.assumptions?.length
        ? [{ ul: method.assumptions.map(text => ({ text, style: 'small' })), margin: [4, 0, 0, 2] }]
        : []),
    ]),
    ...(data.cautions.length
      ? [
          subheading('Cautions that apply to these figures'),
          ...data.cautions.map(caution => ({
            stack: [
              { text: [{ text: `${caution.title}${/[.?!]$/.test(caution.title) ? '' : '.'} `, bold: true, color: PALETTE.ink }, caution.text], style: 'small' },
              ...(caution.sources.length ? [{ text: caution.sources.join(' '), style: 'caption' }] : []),
            ],
            margin: [0, 0, 0, 4],
            unbreakable: true,
          })),
        ]
      : []),
    ...(sources.length
      ? [subheading('Sources'), ...sources.map(source => ({ text: source, style: 'small', margin: [0, 0, 0, 2] }))]
      : []),
  ]
}
