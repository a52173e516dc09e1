/**
 * The establishment run's chart: the frequency of the introduced variant in the recipient over
 * time, as a fan of quantiles over replicates (median, 25–75 %, 5–95 %), from the result of the
 * allele-frequency simulation (`simulateEstablishment` → `trajectoryQuantiles`), plus the words
 * that go with it. Pure: the run panel renders the option with vue-echarts.
 */
import type { EChartsOption } from 'echarts'
import type { EstablishmentResult } from '../genetics/simulate'
import { axisStyle, chartBase, CHART_COLOURS } from './chart-theme'
import { fanSeries, fanTooltipLine, generationLabels } from './simulation-fan'

/** What the chart reads of a result. */
export type EstablishmentChartInput = Pick<EstablishmentResult, 'trajectoryQuantiles'>

/**
 * ECharts option of the frequency fan.
 *
 * @param result - an establishment result (only `trajectoryQuantiles` is read)
 * @param options.generationTimeYears - label the axis in years from the start (else generations)
 * @param options.animation - animate (page) or not (server); default false
 * @returns a category x axis of generations, a 0–1 value axis and the fan's series
 */
export function establishmentTrajectoryChartOption(result: EstablishmentChartInput, options: { generationTimeYears?: number, animation?: boolean } = {}): EChartsOption {
  const quantiles = result.trajectoryQuantiles
  const labels = generationLabels(quantiles.generation, options.generationTimeYears)
  const name = 'Variant frequency in the recipient'
  const unit = options.generationTimeYears ? 'years from the start' : 'generations from the start'
  return {
    ...chartBase(options.animation ?? false),
    aria: { enabled: true, label: { description: establishmentChartSummary(result) } },
    grid: { left: 8, right: 16, top: 36, bottom: 28, containLabel: true },
    legend: { top: 0, left: 0, data: [name], itemWidth: 18, itemHeight: 8, textStyle: { color: CHART_COLOURS.text, fontSize: 11 } },
    tooltip: {
      trigger: 'axis',
      formatter: (params: unknown) => {
        const first = (Array.isArray(params) ? params[0] : params) as { dataIndex?: number } | undefined
        const index = first?.dataIndex ?? 0
        return `${unit.startsWith('years') ? 'Year' : 'Generation'} ${labels[index] ?? ''}<br>${fanTooltipLine('Frequency', quantiles, index, 3)}`
      },
    },
    xAxis: { type: 'category', data: labels, boundaryGap: false, name: unit, nameLocation: 'middle', nameGap: 26, ...axisStyle() },
    yAxis: { type: 'value', min: 0, max: 1, ...axisStyle() },
    series: fanSeries(name, quantiles, CHART_COLOURS.accent, 'frequency') as EChartsOption['series'],
  }
}

/**
 * One or two sentences for screen readers and the caption: the median at the end and the
 * spread, e.g. "After 200 generations the variant's median frequency is 1.00 (90 % of
 * replicates between 0.00 and 1.00)."
 */
export function establishmentChartSummary(result: EstablishmentChartInput): string {
  const quantiles = result.trajectoryQuantiles
  const last = quantiles.generation.length - 1
  if (last < 0) return 'No trajectory was recorded.'
  const at = (series: readonly number[]) => (series[last] ?? 0).toFixed(2)
  return `Frequency of the variant in the recipient over time, over all replicates. After ${quantiles.generation[last]} generations the median frequency is ${at(quantiles.q50)} (90 % of replicates between ${at(quantiles.q05)} and ${at(quantiles.q95)}).`
}

/**
 * The headline of an establishment run in words: "Established in 41.2 % of 2,000 replicates
 * (95 % interval 39.0–43.4 %)".
 *
 * @example establishmentHeadline({ replicates: 2000, established: 824, interval95: [0.39, 0.434] })
 *   // 'Established in 41.2 % of 2,000 replicates (95 % interval 39.0–43.4 %)'
 */
export function establishmentHeadline(result: Pick<EstablishmentResult, 'replicates' | 'established' | 'interval95'>): string {
  const percent = (value: number) => `${(value * 100).toFixed(1)}`
  return `Established in ${percent(result.established / result.replicates)} % of ${result.replicates.toLocaleString('en-US')} replicates (95 % interval ${percent(result.interval95[0])}–${percent(result.interval95[1])} %)`
}
