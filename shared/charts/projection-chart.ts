/**
 * The projection charts: one quantity (F, H or relative fitness) against years from now, for the
 * isolated subpopulation and, when given, with gene flow. The page shows the three as small
 * multiples; the PDF brief renders the same options to SVG on the server.
 */
import type { EChartsOption } from 'echarts'
import { axisStyle, chartBase, CHART_COLOURS } from './chart-theme'
import type { Projection, ProjectionPoint } from './projection-series'

/** The quantity a projection chart shows. */
export type ProjectionMetric = 'inbreeding' | 'heterozygosity' | 'fitness'

/** Title, what the axis measures and how values print, per quantity. */
export const PROJECTION_METRICS: Readonly<Record<ProjectionMetric, { title: string, axis: string, digits: number }>> = {
  inbreeding: { title: 'Inbreeding F', axis: 'measured from today', digits: 3 },
  heterozygosity: { title: 'Heterozygosity retained', axis: 'share of today’s', digits: 3 },
  fitness: { title: 'Relative fitness', axis: 'vs a non-inbred animal', digits: 3 },
}

/** The series names the legend and tooltip show. */
export function projectionSeriesNames(projection: Pick<Projection, 'migrantsPerGeneration'>): { isolated: string, withGeneFlow: string } {
  const migrants = projection.migrantsPerGeneration
  const shown = migrants >= 10 ? migrants.toFixed(0) : migrants >= 1 ? migrants.toFixed(1) : migrants.toPrecision(2)
  return { isolated: 'Isolated', withGeneFlow: `With gene flow (Ne·m = ${shown})` }
}

/**
 * ECharts option for one projection quantity.
 *
 * @param projection - from `projectSubpopulation`
 * @param metric - which quantity to draw
 * @param options.animation - animate (page) or not (server rendering); default false
 * @returns an option with a value x axis in years and one or two line series
 */
export function projectionChartOption(projection: Projection, metric: ProjectionMetric, options: { animation?: boolean } = {}): EChartsOption {
  const meta = PROJECTION_METRICS[metric]
  const names = projectionSeriesNames(projection)
  const line = (name: string, points: readonly ProjectionPoint[], colour: string, dashed: boolean) => ({
    name,
    type: 'line' as const,
    showSymbol: points.length <= 2,
    symbolSize: 5,
    lineStyle: { color: colour, width: 2.25, type: dashed ? 'dashed' as const : 'solid' as const },
    itemStyle: { color: colour },
    data: points.map(point => [point.years, point[metric]]),
  })
  const series = [line(names.isolated, projection.isolated, CHART_COLOURS.primary, false)]
  if (projection.withGeneFlow) series.push(line(names.withGeneFlow, projection.withGeneFlow, CHART_COLOURS.accent, true))
  const lastYears = projection.isolated[projection.isolated.length - 1]?.years ?? 0
  return {
    ...chartBase(options.animation ?? false),
    aria: { enabled: true, label: { description: `${meta.title} over the next ${Math.round(lastYears)} years, ${series.map(s => s.name).join(' and ')}.` } },
    grid: { left: 8, right: 16, top: 36, bottom: 24, containLabel: true },
    legend: { top: 0, left: 0, itemWidth: 18, itemHeight: 8, textStyle: { color: CHART_COLOURS.text, fontSize: 11 } },
    tooltip: {
      trigger: 'axis',
      valueFormatter: (value: unknown) => (typeof value === 'number' ? value.toFixed(meta.digits) : String(value ?? '')),
    },
    xAxis: { type: 'value', name: 'years from now', nameLocation: 'middle', nameGap: 24, min: 0, max: Math.max(1, Math.ceil(lastYears)), ...axisStyle() },
    yAxis: { type: 'value', min: 0, max: metric === 'inbreeding' ? undefined : 1, ...axisStyle() },
    series,
  }
}
