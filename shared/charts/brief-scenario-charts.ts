/**
 * Charts that compare a proposal's scenarios: one quantity (F, H or relative fitness) against
 * years for every scenario, and the establishment probability of each variant per scenario.
 * Pure ECharts options in the app's chart style (./chart-theme.ts), rendered to SVG on the
 * server for the PDF brief (server/brief/charts.ts) and usable as they are in the page.
 */
import type { EChartsOption } from 'echarts'
import { axisStyle, chartBase, CHART_COLOURS } from './chart-theme'
import { PROJECTION_METRICS, type ProjectionMetric } from './projection-chart'

/** One scenario's course of a quantity. */
export interface ScenarioTrajectory {
  name: string
  isBaseline: boolean
  recommended: boolean
  /** [years from now, value] pairs in time order. */
  points: readonly (readonly [number, number])[]
}

/** Colours for scenarios that are neither the baseline nor the recommended one. */
const OTHER_SCENARIO_COLOURS = [CHART_COLOURS.primarySoft, '#6d5a9e', '#7a8b2e', '#b4536a'] as const

/**
 * Line colour and dash for a scenario: the baseline slate and dashed, the recommended scenario
 * ochre and heavier, others in turn from a small palette.
 */
export function scenarioLineStyle(trajectory: Pick<ScenarioTrajectory, 'isBaseline' | 'recommended'>, index: number): { colour: string, dashed: boolean, width: number } {
  if (trajectory.isBaseline) return { colour: CHART_COLOURS.axis, dashed: true, width: 2 }
  if (trajectory.recommended) return { colour: CHART_COLOURS.accent, dashed: false, width: 3 }
  return { colour: OTHER_SCENARIO_COLOURS[index % OTHER_SCENARIO_COLOURS.length] ?? CHART_COLOURS.primary, dashed: false, width: 2 }
}

/**
 * ECharts option: one quantity over time, one line per scenario.
 *
 * @param trajectories - the scenarios (baseline included), each with its points
 * @param metric - which quantity the points hold (sets the title and the y axis)
 * @param options.animation - animate (page) or not (server); default false
 */
export function scenarioTrajectoryChartOption(trajectories: readonly ScenarioTrajectory[], metric: ProjectionMetric, options: { animation?: boolean } = {}): EChartsOption {
  const meta = PROJECTION_METRICS[metric]
  let lastYears = 0
  let others = 0
  const series = trajectories.map((trajectory) => {
    const style = scenarioLineStyle(trajectory, trajectory.isBaseline || trajectory.recommended ? 0 : others++)
    const last = trajectory.points[trajectory.points.length - 1]
    if (last) lastYears = Math.max(lastYears, last[0])
    return {
      name: trajectory.recommended ? `${trajectory.name} (recommended)` : trajectory.name,
      type: 'line' as const,
      showSymbol: trajectory.points.length <= 2,
      symbolSize: 5,
      lineStyle: { color: style.colour, width: style.width, type: style.dashed ? 'dashed' as const : 'solid' as const },
      itemStyle: { color: style.colour },
      data: trajectory.points.map(([years, value]) => [years, value]),
    }
  })
  return {
    ...chartBase(options.animation ?? false),
    aria: { enabled: true, label: { description: `${meta.title} over the next ${Math.round(lastYears)} years for ${series.map(s => s.name).join(', ')}.` } },
    title: { text: meta.title, left: 0, top: 0, textStyle: { fontSize: 13, fontWeight: 'bold', color: CHART_COLOURS.text } },
    grid: { left: 34, right: 18, top: 66, bottom: 28, containLabel: true },
    legend: { top: 22, left: 0, itemWidth: 18, itemHeight: 8, textStyle: { color: CHART_COLOURS.text, fontSize: 11 } },
    tooltip: { trigger: 'axis', valueFormatter: (value: unknown) => (typeof value === 'number' ? value.toFixed(meta.digits) : String(value ?? '')) },
    xAxis: { type: 'value', name: 'years from now', nameLocation: 'middle', nameGap: 24, min: 0, max: Math.max(1, Math.ceil(lastYears)), ...axisStyle() },
    yAxis: { type: 'value', min: 0, max: metric === 'inbreeding' ? undefined : 1, ...axisStyle(), name: meta.axis, nameLocation: 'middle', nameGap: 32, nameRotate: 90 },
    series,
  }
}

/** Establishment of one variant under one scenario. */
export interface EstablishmentBar {
  scenario: string
  variant: string
  recommended: boolean
  /** Probability that at least one release establishes the variant, in [0, 1]. */
  probability: number
}

/**
 * ECharts option: horizontal bars of establishment probability (in %), one bar per scenario and
 * variant, the recommended scenario in ochre.
 *
 * @param bars - scenarios × variants (the baseline moves no animals and has none)
 * @param options.animation - default false
 */
export function establishmentChartOption(bars: readonly EstablishmentBar[], options: { animation?: boolean } = {}): EChartsOption {
  const labels = bars.map(bar => `${bar.scenario} · ${bar.variant}`)
  const percent = (value: number) => Number((value * 100).toPrecision(3))
  return {
    ...chartBase(options.animation ?? false),
    aria: { enabled: true, label: { description: `Establishment probability for ${labels.join(', ')}.` } },
    title: { text: 'Establishment probability over the schedule', left: 0, top: 0, textStyle: { fontSize: 13, fontWeight: 'bold', color: CHART_COLOURS.text } },
    grid: { left: 8, right: 56, top: 34, bottom: 28, containLabel: true },
    xAxis: { type: 'value', name: '%', nameLocation: 'end', min: 0, max: (extent: { max: number }) => Math.min(100, Math.max(5, Math.ceil(extent.max * 1.15))), ...axisStyle() },
    yAxis: { type: 'category', inverse: true, data: labels, ...axisStyle(), axisLabel: { color: CHART_COLOURS.text, fontSize: 11, width: 260, overflow: 'truncate' } },
    series: [{
      type: 'bar',
      barMaxWidth: 18,
      data: bars.map(bar => ({ value: percent(bar.probability), itemStyle: { color: bar.recommended ? CHART_COLOURS.accent : CHART_COLOURS.primarySoft } })),
      label: { show: true, position: 'right', fontSize: 11, color: CHART_COLOURS.text, formatter: ({ value }: { value: unknown }) => `${String(value)}%` },
    }],
  }
}
