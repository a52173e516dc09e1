/**
 * The monitoring charts: inbreeding F, heterozygosity H and census of the recipient against years
 * since the first move, with the projected courses (planned releases, releases made, no action)
 * as lines and what monitoring observed as points. Pure data for vue-echarts (the page) and
 * ECharts' SVG renderer (a brief), from the theme of shared/charts.
 */
import type { EChartsOption } from 'echarts'
import { axisStyle, chartBase, CHART_COLOURS } from '../charts/chart-theme'
import { yearsBetween, type MonitoringProjection } from './monitoring-projection'

export type MonitoringMetric = 'inbreeding' | 'heterozygosity' | 'census'

/** Titles and number formats of the three charts. */
export const MONITORING_METRICS: Readonly<Record<MonitoringMetric, { title: string, digits: number }>> = {
  inbreeding: { title: 'Inbreeding F', digits: 3 },
  heterozygosity: { title: 'Heterozygosity H', digits: 3 },
  census: { title: 'Census (adults)', digits: 0 },
}

/** Series names, the same in the legend, the tooltip and the text summary. */
export const MONITORING_SERIES = {
  planned: 'Projected, as planned',
  actual: 'Projected, moves made',
  noAction: 'Projected, no action',
  observed: 'Observed (follow-ups)',
  record: 'Census record',
  assumed: 'Census the projection assumes',
} as const

/** Dark slate for observed points, so they stand apart from every line. */
export const OBSERVED_COLOUR = '#0f172a'

/** How each series is drawn, for a legend drawn outside the chart. */
export const MONITORING_SERIES_LOOKS = {
  noAction: { colour: CHART_COLOURS.primary, dashed: false, point: false },
  planned: { colour: CHART_COLOURS.accent, dashed: true, point: false },
  actual: { colour: CHART_COLOURS.accent, dashed: false, point: false },
  assumed: { colour: CHART_COLOURS.axis, dashed: true, point: false },
  observed: { colour: OBSERVED_COLOUR, dashed: false, point: true },
  record: { colour: CHART_COLOURS.primarySoft, dashed: false, point: true },
} as const satisfies Record<keyof typeof MONITORING_SERIES, { colour: string, dashed: boolean, point: boolean }>

type Point = [number, number]

function line(name: string, data: Point[], colour: string, dashed: boolean) {
  return {
    name, type: 'line' as const, showSymbol: false, data,
    lineStyle: { color: colour, width: 2, type: dashed ? 'dashed' as const : 'solid' as const },
    itemStyle: { color: colour },
  }
}

function points(name: string, data: Point[], colour: string, symbol: 'circle' | 'diamond') {
  return {
    name, type: 'line' as const, data, symbol, symbolSize: 9, showSymbol: true,
    lineStyle: { opacity: 0, width: 0 }, itemStyle: { color: colour, borderColor: '#ffffff', borderWidth: 1.5 },
    emphasis: { scale: 1.3 },
  }
}

/**
 * The observed values of one metric as [years since the start, value] (record census by year,
 * placed at mid-year).
 */
export function observedSeries(projection: MonitoringProjection, metric: MonitoringMetric, recordCensus: readonly { year: number, adults: number }[] = []): { observed: Point[], record: Point[] } {
  const observed: Point[] = []
  for (const point of projection.observed) {
    const value = point[metric]
    if (value === null) continue
    observed.push([point.yearOffset, value])
  }
  const record: Point[] = metric === 'census'
    ? recordCensus.map(row => [yearsBetween(projection.startOn, `${row.year}-07-01`), row.adults] as Point)
    : []
  return { observed, record }
}

/**
 * ECharts option for one monitoring chart.
 *
 * @param projection - from GET /api/proposals/:id/monitoring
 * @param metric - F, H or census
 * @param options.recordCensus - the recipient's census counts since the start (census chart only)
 * @param options.animation - animate (page) or not (server rendering); default false
 */
export function monitoringChartOption(projection: MonitoringProjection, metric: MonitoringMetric, options: { recordCensus?: readonly { year: number, adults: number }[], animation?: boolean, legend?: boolean } = {}): EChartsOption {
  const meta = MONITORING_METRICS[metric]
  const { observed, record } = observedSeries(projection, metric, options.recordCensus)
  const lastYears = Math.max(1, projection.points[projection.points.length - 1]?.yearOffset ?? 0, ...observed.map(point => point[0]), ...record.map(point => point[0]))
  // Observations before the first move (a baseline) sit left of 0.
  const firstYears = Math.floor(Math.min(0, ...observed.map(point => point[0]), ...record.map(point => point[0])))
  const legend = options.legend ?? true
  const series = metric === 'census'
    ? [
        line(MONITORING_SERIES.assumed, [[0, projection.basis.census], [lastYears, projection.basis.census]], CHART_COLOURS.axis, true),
        points(MONITORING_SERIES.record, record, CHART_COLOURS.primarySoft, 'diamond'),
        points(MONITORING_SERIES.observed, observed, OBSERVED_COLOUR, 'circle'),
      ]
    : [
        line(MONITORING_SERIES.noAction, projection.points.map(point => [point.yearOffset, point.noAction[metric]] as Point), CHART_COLOURS.primary, false),
        line(MONITORING_SERIES.planned, projection.points.map(point => [point.yearOffset, point.planned[metric]] as Point), CHART_COLOURS.accent, true),
        line(MONITORING_SERIES.actual, projection.points.map(point => [point.yearOffset, point.actual[metric]] as Point), CHART_COLOURS.accent, false),
        points(MONITORING_SERIES.observed, observed, OBSERVED_COLOUR, 'circle'),
      ]
  const shown = series.filter(entry => entry.data.length > 0)
  return {
    ...chartBase(options.animation ?? false),
    aria: { enabled: true, label: { description: `${meta.title} of the recipient over ${Math.round(lastYears)} years since ${projection.startOn}: ${shown.map(entry => entry.name).join(', ')}.` } },
    grid: { left: 8, right: 16, top: legend ? 56 : 12, bottom: 24, containLabel: true },
    legend: { show: legend, top: 0, left: 0, itemWidth: 16, itemHeight: 8, textStyle: { color: CHART_COLOURS.text, fontSize: 11 } },
    tooltip: {
      trigger: 'item',
      formatter: (params: unknown) => {
        const item = params as { seriesName?: string, value?: [number, number] }
        const [years, value] = item.value ?? [0, 0]
        return `${item.seriesName ?? ''}<br>${years.toFixed(1)} years: ${value.toFixed(meta.digits)}`
      },
    },
    xAxis: { type: 'value', name: `years since ${projection.startOn}`, nameLocation: 'middle', nameGap: 24, min: firstYears, max: Math.ceil(lastYears), ...axisStyle() },
    yAxis: { type: 'value', min: 0, max: metric === 'heterozygosity' && projection.heterozygosityScale === 'relative' ? 1 : undefined, ...axisStyle() },
    series: shown,
  }
}

/**
 * One or two sentences for screen readers: the latest observation against the projection at
 * that time.
 *
 * @example monitoringChartSummary(projection, 'inbreeding') // 'Inbreeding F observed 0.190 after 1.0 years; projected with the moves made 0.207, without action 0.297.'
 */
export function monitoringChartSummary(projection: MonitoringProjection, metric: MonitoringMetric): string {
  const meta = MONITORING_METRICS[metric]
  const latest = [...projection.observed].reverse().find(point => point[metric] !== null)
  if (!latest) return `${meta.title}: nothing observed yet; the chart shows the projection only.`
  const value = latest[metric] as number
  if (metric === 'census') return `${meta.title} observed ${value} after ${latest.yearOffset.toFixed(1)} years; the projection assumes ${projection.basis.census}.`
  let at = projection.points[0]
  if (!at) return `${meta.title} observed ${value.toFixed(meta.digits)} after ${latest.yearOffset.toFixed(1)} years.`
  for (const point of projection.points) {
    if (Math.abs(point.yearOffset - latest.yearOffset) < Math.abs(at.yearOffset - latest.yearOffset)) at = point
  }
  return `${meta.title} observed ${value.toFixed(meta.digits)} after ${latest.yearOffset.toFixed(1)} years; projected with the moves made ${at.actual[metric].toFixed(meta.digits)}, without action ${at.noAction[metric].toFixed(meta.digits)} (nearest generation, ${at.yearOffset.toFixed(1)} years).`
}
