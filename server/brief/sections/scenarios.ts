/**
 * Section 2: the scenarios compared — a table of schedules and outcomes at the horizon, and the
 * charts of F and relative fitness over time for every scenario, and of establishment.
 */
import { establishmentChartOption, scenarioTrajectoryChartOption, type EstablishmentBar, type ScenarioTrajectory } from '../../../shared/charts/brief-scenario-charts'
import type { PdfContent } from '../pdf-types'
import type { BriefData, BriefScenario } from '../types'
import { renderChartSvg } from '../charts'
import { formatFixed, formatMigrants, formatNumber, formatProbability } from '../format'
import { CONTENT_WIDTH, dataTable, PALETTE, sectionHeading, subheading } from './style'

function trajectories(data: BriefData, metric: 'inbreeding' | 'fitness'): ScenarioTrajectory[] {
  return data.scenarios.map(scenario => ({
    name: scenario.name,
    isBaseline: scenario.isBaseline,
    recommended: scenario.recommended,
    points: scenario.projection.map(point => [point.years, point[metric]] as const),
  }))
}

function establishmentCell(scenario: BriefScenario): PdfContent {
  if (scenario.isBaseline || scenario.establishment.length === 0) return { text: '—', alignment: 'right' }
  return { stack: scenario.establishment.map(item => ({ text: formatProbability(item.overSchedule), alignment: 'right' })) }
}

function nameCell(scenario: BriefScenario): PdfContent {
  const tag = scenario.recommended ? 'recommended' : scenario.isBaseline ? 'baseline' : ''
  return {
    stack: [
      { text: scenario.name, bold: true, color: scenario.recommended ? PALETTE.ochre600 : PALETTE.ink },
      ...(tag ? [{ text: tag, fontSize: 7, color: PALETTE.muted }] : []),
    ],
  }
}

/** Section 2 content. */
export function scenariosSection(data: BriefData, number: number): PdfContent[] {
  const horizons = [...new Set(data.scenarios.map(scenario => scenario.horizonYears))]
  const horizonLabel = horizons.length === 1 ? `${horizons[0]} y` : 'horizon'
  const rows = data.scenarios.map(scenario => [
    nameCell(scenario),
    { text: scenario.scheduleText },
    { text: scenario.sourceName ?? '—' },
    formatNumber(scenario.animalsMoved),
    formatMigrants(scenario.migrantsPerGeneration),
    formatFixed(scenario.atHorizon.inbreeding, 3),
    formatFixed(scenario.atHorizon.heterozygosity, 3),
    formatFixed(scenario.atHorizon.fitness, 3),
    establishmentCell(scenario),
  ])
  const chartWidth = (CONTENT_WIDTH - 12) / 2
  const chartHeight = 200
  const bars: EstablishmentBar[] = data.scenarios
    .filter(scenario => !scenario.isBaseline)
    .flatMap(scenario => scenario.establishment.map(item => ({ scenario: scenario.name, variant: item.variantName, recommended: scenario.recommended, probability: item.overSchedule })))

  const charts: PdfContent[] = [
    {
      stack: [
        {
          columns: [
            { svg: renderChartSvg(scenarioTrajectoryChartOption(trajectories(data, 'inbreeding'), 'inbreeding'), { width: chartWidth, height: chartHeight }), width: chartWidth, font: 'Inter' },
            { svg: renderChartSvg(scenarioTrajectoryChartOption(trajectories(data, 'fitness'), 'fitness'), { width: chartWidth, height: chartHeight }), width: chartWidth, font: 'Inter' },
          ],
          columnGap: 12,
          margin: [0, 6, 0, 2],
        },
        { text: 'Figure 2. Expected inbreeding F (left) and expected fitness relative to a non-inbred animal (right) over time, for each scenario. The baseline moves no animals.', style: 'caption', margin: [0, 0, 0, 8] },
      ],
      unbreakable: true,
    },
  ]
  if (bars.length > 0) {
    const height = Math.min(56 + bars.length * 22, 220)
    charts.push({
      stack: [
        { svg: renderChartSvg(establishmentChartOption(bars), { width: CONTENT_WIDTH, height }), width: CONTENT_WIDTH, font: 'Inter', margin: [0, 4, 0, 2] },
        { text: 'Figure 3. Probability that at least one release establishes each adaptive variant (section 4 gives the method).', style: 'caption', margin: [0, 0, 0, 8] },
      ],
      unbreakable: true,
    })
  }

  return [
    sectionHeading(number, 'Scenarios compared'),
    { text: `Each scenario is a release schedule with its assumptions; every figure at the horizon (${horizonLabel}) is an expectation for the recipient, ${data.recipient.name}.`, style: 'body', margin: [0, 0, 0, 4] },
    dataTable(
      ['Scenario', 'Schedule', 'Source', 'Animals', 'Ne·m', `F (${horizonLabel})`, `H (${horizonLabel})`, `W (${horizonLabel})`, 'Establish.'],
      rows,
      [58, '*', 54, 32, 26, 34, 34, 34, 42],
      { alignRight: [3, 4, 5, 6, 7], fontSize: 7.8 },
    ),
    { text: 'Ne·m: effective migrants per generation while releases continue. F: expected inbreeding from today. H: heterozygosity as a share of today\'s. W: expected fitness relative to a non-inbred animal. Establish.: probability that at least one release establishes the variant (one line per variant).', style: 'caption', margin: [0, 0, 0, 6] },
    subheading('Charts'),
    ...charts,
  ]
}
