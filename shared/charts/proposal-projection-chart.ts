/**
 * The scenario projection chart of the proposal workspace: one quantity (F, H or relative
 * fitness) against years, with this scenario's releases and without any ("No action"), the
 * releases marked on the time axis and — for fitness — the band over the lethal-equivalent
 * range. Pure: the page draws it with vue-echarts, the PDF brief renders the same option to SVG.
 */
import type { EChartsOption } from 'echarts'
import type { ScenarioProjection } from '../proposals/types'
import { axisStyle, chartBase, CHART_COLOURS } from './chart-theme'
import { PROJECTION_METRICS, type ProjectionMetric } from './projection-chart'

/** Series names in the legend and tooltip. */
export const PROPOSAL_PROJECTION_SERIES = {
  without: 'No action',
  band: 'Range over lethal equivalents',
} as const

/** The y values of one quantity. */
export function projectionValues(projection: ScenarioProjection, metric: ProjectionMetric, which: 'withAction' | 'withoutAction'): number[] {
  const series = projection[which]
  return metric === 'inbreeding' ? series.inbreeding : metric === 'heterozygosity' ? series.heterozygosity : series.fitness
}

/**
 * ECharts option for one projected quantity of a scenario.
 *
 * @param projection - from `computeScenarioResults(...).projection`
 * @param metric - 'inbreeding' | 'heterozygosity' | 'fitness'
 * @param options.scenarioName - legend name of the with-action line (default 'With releases')
 * @param options.animation - animate (page) or not (server); default false
 * @returns a value x axis in years, lines with and without action, release marks and, for
 *   fitness, a shaded band over the load range of the with-action line
 */
export function proposalProjectionChartOption(
  projection: ScenarioProjection,
  metric: ProjectionMetric,
  options: { scenarioName?: string, animation?: boolean, showRelease?: boolean } = {},
): EChartsOption {
  const meta = PROJECTION_METRICS[metric]
  const withName = options.scenarioName ?? 'With releases'
  const years = projection.years
  const points = (values: readonly number[]) => values.map((value, index) => [years[index] ?? 0, value])
  const hasReleases = projection.releases.length > 0 && options.showRelease !== false
  const lastYears = years[years.length - 1] ?? 0
  const series: NonNullable<EChartsOption['series']> = []
  if (metric === 'fitness' && hasReleases) {
    // Band = stacked area: the low edge (transparent) plus the width up to the high edge.
    const low = projection.withAction.fitnessHigh // more lethal equivalents → lower fitness
    const high = projection.withAction.fitnessLow
    series.push({
      name: PROPOSAL_PROJECTION_SERIES.band, type: 'line', stack: 'band', symbol: 'none', silent: true,
      lineStyle: { opacity: 0 }, areaStyle: { opacity: 0 }, data: points(low), tooltip: { show: false },
    } as never)
    series.push({
      name: PROPOSAL_PROJECTION_SERIES.band, type: 'line', stack: 'band', symbol: 'none', silent: true,
      lineStyle: { opacity: 0 }, areaStyle: { color: CHART_COLOURS.accent, opacity: 0.16 },
      data: high.map((value, index) => [years[index] ?? 0, value - (low[index] ?? 0)]), tooltip: { show: false },
    } as never)
  }
  series.push({
    name: PROPOSAL_PROJECTION_SERIES.without,
    type: 'line',
    showSymbol: false,
    lineStyle: { color: CHART_COLOURS.primary, width: 2.25, type: 'dashed' },
    itemStyle: { color: CHART_COLOURS.primary },
    data: points(projectionValues(projection, metric, 'withoutAction')),
  })
  if (hasReleases) {
    series.push({
      name: withName,
      type: 'line',
      showSymbol: false,
      lineStyle: { color: CHART_COLOURS.accent, width: 2.5 },
      itemStyle: { color: CHART_COLOURS.accent },
      data: points(projectionValues(projection, metric, 'withAction')),
      markLine: {
        silent: true,
        symbol: 'none',
        label: { show: false },
        lineStyle: { color: CHART_COLOURS.quiet, type: 'dotted', width: 1 },
        data: projection.releases.map(release => ({ xAxis: release.year })),
      },
    })
  }
  const legendNames = hasReleases ? [PROPOSAL_PROJECTION_SERIES.without, withName] : [PROPOSAL_PROJECTION_SERIES.without]
  return {
    ...chartBase(options.animation ?? false),
    aria: {
      enabled: true,
      label: { description: `${meta.title} over the next ${Math.round(lastYears)} years, ${hasReleases ? `with ${withName} and without action` : 'without action'}.` },
    },
    grid: { left: 8, right: 16, top: 34, bottom: 24, containLabel: true },
    legend: { top: 0, left: 0, data: legendNames, itemWidth: 18, itemHeight: 8, textStyle: { color: CHART_COLOURS.text, fontSize: 11 } },
    tooltip: {
      trigger: 'axis',
      valueFormatter: (value: unknown) => (typeof value === 'number' ? value.toFixed(meta.digits) : String(value ?? '')),
    },
    xAxis: { type: 'value', name: 'years from now', nameLocation: 'middle', nameGap: 24, min: 0, max: Math.max(1, Math.ceil(lastYears)), ...axisStyle() },
    // No axis name: the caption above the chart says what is drawn (a long name would be cut off).
    yAxis: { type: 'value', scale: metric !== 'inbreeding', min: metric === 'inbreeding' ? 0 : undefined, ...axisStyle() },
    series,
  }
}
