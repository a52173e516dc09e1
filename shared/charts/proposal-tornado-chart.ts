/**
 * The tornado chart of the proposal sensitivity view: for each uncertain input, a bar from the
 * result at the low end of its plausible range to the result at the high end, drawn as the
 * change from the central result (the two ends overlap on one row), largest swing on top. Inputs that do not enter the result
 * keep a row labelled "no effect". Pure ECharts option (page and PDF brief).
 */
import type { EChartsOption } from 'echarts'
import type { Tornado } from '../proposals/sensitivity'
import { SENSITIVITY_METRIC_LABELS } from '../proposals/sensitivity'
import { axisStyle, chartBase, CHART_COLOURS } from './chart-theme'

function inputText(value: number): string {
  if (!Number.isFinite(value)) return '—'
  const magnitude = Math.abs(value)
  if (magnitude >= 100) return Math.round(value).toLocaleString('en-US')
  return String(Number(value.toPrecision(3)))
}

/** How the result prints on the chart: % for establishment, 3 decimals for fitness. */
export function tornadoValueText(metric: Tornado['metric'], value: number): string {
  if (!Number.isFinite(value)) return '—'
  return metric === 'establishment' ? `${Number((value * 100).toPrecision(3))}%` : value.toFixed(3)
}

/**
 * ECharts option for a tornado.
 *
 * @param data - from `tornado(metric, …)`
 * @param options.animation - default false
 * @returns horizontal bars on a category axis of inputs; x = change from the central result
 *   (percentage points for establishment, fitness units otherwise)
 */
export function tornadoChartOption(data: Tornado, options: { animation?: boolean } = {}): EChartsOption {
  const scale = data.metric === 'establishment' ? 100 : 1
  const labels = data.bars.map(bar => (bar.affects
    ? `${bar.label}\n${inputText(bar.lowInput)} – ${inputText(bar.highInput)}`
    : `${bar.label}\nno effect`))
  const deviation = (value: number) => (Number.isFinite(value) ? (value - data.central) * scale : 0)
  const item = (value: number, colour: string, affects: boolean) => ({
    value: affects ? Number(deviation(value).toPrecision(6)) : 0,
    itemStyle: { color: colour },
    label: { show: affects, formatter: () => tornadoValueText(data.metric, value) },
  })
  const axisName = data.metric === 'establishment' ? 'change from central (percentage points)' : 'change from central'
  return {
    ...chartBase(options.animation ?? false),
    aria: {
      enabled: true,
      label: {
        description: `Sensitivity of ${SENSITIVITY_METRIC_LABELS[data.metric].toLowerCase()} (central ${tornadoValueText(data.metric, data.central)}): `
          + data.bars.map(bar => (bar.affects
            ? `${bar.label} from ${inputText(bar.lowInput)} to ${inputText(bar.highInput)} gives ${tornadoValueText(data.metric, bar.lowValue)} to ${tornadoValueText(data.metric, bar.highValue)}`
            : `${bar.label} has no effect`)).join('; ') + '.',
      },
    },
    grid: { left: 8, right: 56, top: 28, bottom: 30, containLabel: true },
    legend: { top: 0, left: 0, itemWidth: 12, itemHeight: 10, textStyle: { color: CHART_COLOURS.text, fontSize: 11 } },
    tooltip: {
      trigger: 'item',
      formatter: (params: unknown) => {
        const { dataIndex, seriesName } = params as { dataIndex: number, seriesName: string }
        const bar = data.bars[dataIndex]
        if (!bar || !bar.affects) return ''
        const low = seriesName.startsWith('Low')
        return `${bar.label} = ${inputText(low ? bar.lowInput : bar.highInput)}: ${tornadoValueText(data.metric, low ? bar.lowValue : bar.highValue)}`
      },
    },
    xAxis: { type: 'value', name: axisName, nameLocation: 'middle', nameGap: 22, ...axisStyle() },
    yAxis: { type: 'category', inverse: true, data: labels, ...axisStyle(), axisLabel: { color: CHART_COLOURS.text, fontSize: 11, lineHeight: 14 } },
    series: [
      {
        name: 'Low end of the input',
        type: 'bar',
        itemStyle: { color: CHART_COLOURS.primarySoft },
        barMaxWidth: 22,
        barGap: '-100%',
        label: { position: 'outside', fontSize: 10.5, color: CHART_COLOURS.text },
        data: data.bars.map(bar => item(bar.lowValue, CHART_COLOURS.primarySoft, bar.affects)),
        markLine: { silent: true, symbol: 'none', label: { show: false }, lineStyle: { color: CHART_COLOURS.axis, type: 'solid', width: 1 }, data: [{ xAxis: 0 }] },
      },
      {
        name: 'High end of the input',
        type: 'bar',
        itemStyle: { color: CHART_COLOURS.accent },
        barMaxWidth: 22,
        barGap: '-100%',
        label: { position: 'outside', fontSize: 10.5, color: CHART_COLOURS.text },
        data: data.bars.map(bar => item(bar.highValue, CHART_COLOURS.accent, bar.affects)),
      },
    ] as NonNullable<EChartsOption['series']>,
  }
}
