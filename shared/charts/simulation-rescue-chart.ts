/**
 * The rescue run's charts, from the result of the individual-based simulation
 * (`simulateRescue`): one quantity (heterozygosity, inbreeding F, mean fitness, adaptive-variant
 * frequency) over time with and without the releases, each as a fan of quantiles over
 * replicates, and the rescue effect (fitness with ÷ without, per replicate) with its line at 1.
 * Pure: the run panel renders the options with vue-echarts.
 */
import type { EChartsOption } from 'echarts'
import type { Bands, RescueMetric, RescueResult } from '../genetics/simulate'
import { axisStyle, chartBase, CHART_COLOURS } from './chart-theme'
import { fanSeries, fanTooltipLine, formatValue, generationLabels } from './simulation-fan'

/** The quantities the panel offers, with their titles and axes. */
export const RESCUE_CHART_METRICS = {
  heterozygosity: { title: 'Heterozygosity H', axis: 'mean over marker loci', digits: 3, min: 0, max: undefined },
  pedigreeInbreeding: { title: 'Inbreeding F (pedigree)', axis: 'from the start of the releases', digits: 3, min: 0, max: undefined },
  markerInbreeding: { title: 'Inbreeding F (markers)', axis: '1 − H / H at the start', digits: 3, min: undefined, max: undefined },
  meanFitness: { title: 'Mean fitness', axis: 'relative to a genome without harmful mutations', digits: 3, min: 0, max: undefined },
  adaptiveFrequency: { title: 'Adaptive-variant frequency', axis: 'in the recipient', digits: 3, min: 0, max: 1 },
} as const satisfies Partial<Record<RescueMetric, { title: string, axis: string, digits: number, min: number | undefined, max: number | undefined }>>

export type RescueChartMetric = keyof typeof RESCUE_CHART_METRICS

/** Names of the two arms in legends and tooltips. */
export const RESCUE_ARM_NAMES = { with: 'With releases', without: 'Without releases' } as const

/** What the charts read of a result. */
export type RescueChartInput = Pick<RescueResult, 'generation' | 'withTranslocation' | 'withoutTranslocation' | 'rescueEffect' | 'replicates'>

function tooltip(labels: readonly string[], unit: string, lines: (index: number) => string[]) {
  return {
    trigger: 'axis' as const,
    formatter: (params: unknown) => {
      const first = (Array.isArray(params) ? params[0] : params) as { dataIndex?: number } | undefined
      const index = first?.dataIndex ?? 0
      return [`${unit.startsWith('years') ? 'Year' : 'Generation'} ${labels[index] ?? ''}`, ...lines(index)].join('<br>')
    },
  }
}

/**
 * ECharts option of one quantity with and without releases.
 *
 * @param result - a rescue result
 * @param metric - which quantity (see RESCUE_CHART_METRICS)
 * @param options.generationTimeYears - label the axis in years (else generations)
 * @param options.animation - default false
 * @returns two fans (with releases in ochre, without in river teal, dashed)
 */
export function rescueMetricChartOption(result: RescueChartInput, metric: RescueChartMetric, options: { generationTimeYears?: number, animation?: boolean } = {}): EChartsOption {
  const meta = RESCUE_CHART_METRICS[metric]
  const labels = generationLabels(result.generation, options.generationTimeYears)
  const unit = options.generationTimeYears ? 'years from the start' : 'generations from the start'
  const withBands = result.withTranslocation[metric]
  const withoutBands = result.withoutTranslocation[metric]
  return {
    ...chartBase(options.animation ?? false),
    aria: { enabled: true, label: { description: rescueMetricSummary(result, metric) } },
    grid: { left: 8, right: 16, top: 36, bottom: 28, containLabel: true },
    legend: { top: 0, left: 0, data: [RESCUE_ARM_NAMES.with, RESCUE_ARM_NAMES.without], itemWidth: 18, itemHeight: 8, textStyle: { color: CHART_COLOURS.text, fontSize: 11 } },
    tooltip: tooltip(labels, unit, index => [
      fanTooltipLine(RESCUE_ARM_NAMES.with, withBands, index, meta.digits),
      fanTooltipLine(RESCUE_ARM_NAMES.without, withoutBands, index, meta.digits),
    ]),
    xAxis: { type: 'category', data: labels, boundaryGap: false, name: unit, nameLocation: 'middle', nameGap: 26, ...axisStyle() },
    yAxis: { type: 'value', min: meta.min, max: meta.max, scale: meta.min === undefined, ...axisStyle() },
    series: [
      ...fanSeries(RESCUE_ARM_NAMES.without, withoutBands, CHART_COLOURS.primary, 'without', true),
      ...fanSeries(RESCUE_ARM_NAMES.with, withBands, CHART_COLOURS.accent, 'with'),
    ] as EChartsOption['series'],
  }
}

/**
 * ECharts option of the rescue effect: per replicate, mean fitness with releases ÷ without
 * (same burn-in, same random stream), as a fan, with a reference line at 1 (no effect).
 */
export function rescueEffectChartOption(result: RescueChartInput, options: { generationTimeYears?: number, animation?: boolean } = {}): EChartsOption {
  const labels = generationLabels(result.generation, options.generationTimeYears)
  const unit = options.generationTimeYears ? 'years from the start' : 'generations from the start'
  const name = 'Fitness with ÷ without releases'
  const series = fanSeries(name, result.rescueEffect, CHART_COLOURS.accent, 'effect')
  const median = series[series.length - 1]
  if (median) median.markLine = { silent: true, symbol: 'none', label: { show: false }, lineStyle: { color: CHART_COLOURS.axis, type: 'dotted' }, data: [{ yAxis: 1 }] }
  return {
    ...chartBase(options.animation ?? false),
    aria: { enabled: true, label: { description: rescueEffectSummary(result) } },
    grid: { left: 8, right: 16, top: 36, bottom: 28, containLabel: true },
    legend: { top: 0, left: 0, data: [name], itemWidth: 18, itemHeight: 8, textStyle: { color: CHART_COLOURS.text, fontSize: 11 } },
    tooltip: tooltip(labels, unit, index => [fanTooltipLine('Ratio', result.rescueEffect, index, 3)]),
    xAxis: { type: 'category', data: labels, boundaryGap: false, name: unit, nameLocation: 'middle', nameGap: 26, ...axisStyle() },
    yAxis: { type: 'value', scale: true, ...axisStyle() },
    series: series as EChartsOption['series'],
  }
}

function lastValue(bands: Bands, key: keyof Bands): number | null {
  const series = bands[key]
  return series[series.length - 1] ?? null
}

/** The chart's words: medians of both arms at the end. */
export function rescueMetricSummary(result: RescueChartInput, metric: RescueChartMetric): string {
  const meta = RESCUE_CHART_METRICS[metric]
  const generations = result.generation[result.generation.length - 1] ?? 0
  const withMedian = formatValue(lastValue(result.withTranslocation[metric], 'q50'), meta.digits)
  const withoutMedian = formatValue(lastValue(result.withoutTranslocation[metric], 'q50'), meta.digits)
  return `${meta.title} over ${generations} generations, median over ${result.replicates} replicates: ${withMedian} with releases and ${withoutMedian} without at the end.`
}

/** The rescue effect's words: the median ratio and its 90 % range at the end. */
export function rescueEffectSummary(result: RescueChartInput): string {
  const median = lastValue(result.rescueEffect, 'q50')
  if (median === null) return 'No replicate kept a breeding recipient in both arms to the end.'
  const low = formatValue(lastValue(result.rescueEffect, 'q05'), 2)
  const high = formatValue(lastValue(result.rescueEffect, 'q95'), 2)
  return `At the end, mean fitness with releases is ${median.toFixed(2)} times that without (90 % of replicates between ${low} and ${high}).`
}
