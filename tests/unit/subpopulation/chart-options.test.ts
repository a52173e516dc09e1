/**
 * The chart option builders shared by the page and the PDF brief (shared/charts/*): the census
 * chart's stacked parts add up to the adults of each year and keep gaps; the projection charts
 * draw the series they are given; both are plain data an ECharts SVG renderer on the server can
 * take (checked by rendering them with ECharts' server-side SVG output). Also the number
 * formats used beside them and the method notes. Expected values are arithmetic on the inputs
 * (common practice, no source).
 */
import * as echarts from 'echarts'
import { describe, expect, it } from 'vitest'
import { censusChartOption, censusChartSlots, censusSlotSummary } from '../../../shared/charts/census-chart'
import { formatCoefficient, formatEffectiveSize, formatGenerations, formatLoss } from '../../../shared/charts/number-format'
import { projectionChartOption, projectionSeriesNames } from '../../../shared/charts/projection-chart'
import { LETHAL_EQUIVALENT_PRESETS, plainCitation, PROJECTION_CAUTION_IDS, PROJECTION_METHOD_NOTES } from '../../../shared/charts/projection-methods'
import { projectSubpopulation } from '../../../shared/charts/projection-series'
import { CAUTIONS, DEFAULT_DIPLOID_LETHAL_EQUIVALENTS } from '../../../shared/genetics'

const rows = [
  { year: 2021, adults: 20, males: 8, females: 9 },
  { year: 2019, adults: 15, males: null, females: null },
  { year: 2022, adults: 12, males: 5, females: null },
]

type SeriesLike = { name: string, data: unknown[], stack?: string, type: string }

function renderSvg(option: echarts.EChartsOption): string {
  const chart = echarts.init(null, null, { renderer: 'svg', ssr: true, width: 600, height: 300 })
  chart.setOption({ ...option, animation: false })
  const svg = chart.renderToSVGString()
  chart.dispose()
  return svg
}

describe('census chart', () => {
  it('keeps every year from the first to the last, with empty slots for missing years', () => {
    const slots = censusChartSlots(rows)
    expect(slots.map(slot => slot.year)).toEqual([2019, 2020, 2021, 2022])
    expect(slots[1]).toEqual({ year: 2020, adults: null, males: null, females: null, notSexed: null })
    expect(censusChartSlots([])).toEqual([])
  })

  it('stacks males, females and adults not sexed so each bar is the adult count', () => {
    const option = censusChartOption(rows)
    const series = option.series as SeriesLike[]
    expect(series.map(s => [s.name, s.type, s.stack])).toEqual([
      ['Males', 'bar', 'adults'], ['Females', 'bar', 'adults'], ['Adults not sexed', 'bar', 'adults'],
    ])
    const totals = censusChartSlots(rows).map((_, i) => series.reduce((sum, s) => sum + (Number(s.data[i]) || 0), 0))
    expect(totals).toEqual([15, 0, 20, 12])
    expect((option.xAxis as { data: string[] }).data).toEqual(['2019', '2020', '2021', '2022'])
    expect(option.animation).toBe(false)
  })

  it('says each year in words', () => {
    const [y2019, y2020, y2021, y2022] = censusChartSlots(rows)
    expect(censusSlotSummary(y2019!)).toBe('2019: 15 adults (not sexed)')
    expect(censusSlotSummary(y2020!)).toBe('2020: no census')
    expect(censusSlotSummary(y2021!)).toBe('2021: 20 adults (8 males, 9 females, 3 not sexed)')
    expect(censusSlotSummary(y2022!)).toBe('2022: 12 adults (5 males, 7 not sexed)')
  })

  it('renders to SVG on the server with ECharts (the brief\'s path)', () => {
    const svg = renderSvg(censusChartOption(rows))
    expect(svg.startsWith('<svg')).toBe(true)
    expect(svg).toContain('2021')
    expect(svg).toContain('Adults not sexed')
  })
})

describe('projection charts', () => {
  const projection = projectSubpopulation({ effectiveSize: 25, generationTimeYears: 5, horizonYears: 50, migrationRate: 0.04, diploidLethalEquivalents: DEFAULT_DIPLOID_LETHAL_EQUIVALENTS.totalFitnessWild })

  it('draws the isolated and the gene-flow series of the chosen quantity against years', () => {
    for (const metric of ['inbreeding', 'heterozygosity', 'fitness'] as const) {
      const option = projectionChartOption(projection, metric)
      const series = option.series as SeriesLike[]
      expect(series.map(s => s.name)).toEqual(['Isolated', 'With gene flow (Ne·m = 1.0)'])
      expect(series[0]!.data).toEqual(projection.isolated.map(point => [point.years, point[metric]]))
      expect(series[1]!.data).toEqual(projection.withGeneFlow!.map(point => [point.years, point[metric]]))
      expect((option.xAxis as { max: number }).max).toBe(50)
    }
    const isolatedOnly = projectSubpopulation({ effectiveSize: 25, generationTimeYears: 5, horizonYears: 50, migrationRate: 0, diploidLethalEquivalents: 12 })
    expect((projectionChartOption(isolatedOnly, 'fitness').series as SeriesLike[]).map(s => s.name)).toEqual(['Isolated'])
    expect(projectionSeriesNames({ migrantsPerGeneration: 0.25 }).withGeneFlow).toBe('With gene flow (Ne·m = 0.25)')
    expect(projectionSeriesNames({ migrantsPerGeneration: 12.4 }).withGeneFlow).toBe('With gene flow (Ne·m = 12)')
  })

  it('renders to SVG on the server with ECharts', () => {
    const svg = renderSvg(projectionChartOption(projection, 'inbreeding'))
    expect(svg).toContain('Isolated')
    expect(svg).toContain('years from now')
  })
})

describe('method notes and formats', () => {
  it('cites every projected quantity and uses the engine\'s lethal-equivalent defaults', () => {
    for (const note of Object.values(PROJECTION_METHOD_NOTES)) {
      expect(note.formula.length).toBeGreaterThan(5)
      expect(note.citation).not.toMatch(/\[/)
    }
    expect(LETHAL_EQUIVALENT_PRESETS.map(preset => preset.value)).toEqual([DEFAULT_DIPLOID_LETHAL_EQUIVALENTS.totalFitnessWild, DEFAULT_DIPLOID_LETHAL_EQUIVALENTS.juvenileSurvival])
    expect(LETHAL_EQUIVALENT_PRESETS[0].citation).toMatch(/O'Grady .*2006/)
    for (const id of PROJECTION_CAUTION_IDS) expect(CAUTIONS[id]).toBeDefined()
    expect(plainCitation('Author (2000) Journal 1:2 [abstract]')).toBe('Author (2000) Journal 1:2')
  })

  it('prints figures the same way everywhere', () => {
    expect(formatEffectiveSize(1365.6)).toBe('1,366')
    expect(formatEffectiveSize(30.64)).toBe('30.6')
    expect(formatEffectiveSize(48)).toBe('48')
    expect(formatEffectiveSize(Number.NaN)).toBe('—')
    expect(formatCoefficient(0.0956179)).toBe('0.096')
    expect(formatLoss(0.82)).toBe('−18%')
    expect(formatLoss(1)).toBe('0%')
    expect(formatGenerations(50 / 3)).toBe('16.7')
    expect(formatGenerations(20)).toBe('20')
  })
})
