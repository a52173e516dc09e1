/**
 * Heat map of establishment probability over selection coefficient s (columns) and effective
 * size Ne (rows, logarithmic), with the cell nearest the scenario's own (s, Ne) outlined in
 * ochre. A sequential river palette from the lowest to the highest value on the map (light =
 * less likely, deep = more likely; the scale's ends are printed) and the value written in each
 * cell, so colour is never the only signal. Pure ECharts option (page and PDF brief).
 */
import type { EChartsOption } from 'echarts'
import type { EstablishmentHeatmap } from '../proposals/sensitivity'
import { chartBase, CHART_COLOURS } from './chart-theme'

/** Light to deep river (tailwind river-50 … river-900). */
export const HEATMAP_COLOURS = ['#eefaf9', '#a9e2df', '#44aeac', '#1f7576', '#173f42'] as const

function sText(value: number): string {
  return String(Number(value.toPrecision(2)))
}

function neText(value: number): string {
  return value >= 100 ? Math.round(value).toLocaleString('en-US') : String(Number(value.toPrecision(2)))
}

/** A cell value as a short percentage ("12%", "0.4%", "<0.1%"). */
export function heatmapCellText(probability: number): string {
  if (!Number.isFinite(probability)) return '—'
  const percent = probability * 100
  if (percent === 0) return '0'
  if (percent < 0.1) return '<0.1'
  return percent >= 10 ? percent.toFixed(0) : String(Number(percent.toPrecision(2)))
}

function nearestIndex(values: readonly number[], target: number, logarithmic: boolean): number {
  let best = 0
  let bestDistance = Number.POSITIVE_INFINITY
  values.forEach((value, index) => {
    const distance = logarithmic ? Math.abs(Math.log(value) - Math.log(target)) : Math.abs(value - target)
    if (distance < bestDistance) {
      bestDistance = distance
      best = index
    }
  })
  return best
}

/**
 * ECharts option for the heat map.
 *
 * @param heatmap - from `establishmentHeatmap`
 * @param options.animation - default false
 * @returns category axes (s across, Ne up), a heatmap series with % labels, a continuous
 *   visual map from the lowest to the highest value, and an ochre outline on the cell nearest
 *   the scenario's values
 */
export function establishmentHeatmapOption(heatmap: EstablishmentHeatmap, options: { animation?: boolean } = {}): EChartsOption {
  const cells: [number, number, number][] = []
  let highest = 0
  let lowest = Number.POSITIVE_INFINITY
  heatmap.values.forEach((row, rowIndex) => row.forEach((value, columnIndex) => {
    const percent = Number.isFinite(value) ? value * 100 : 0
    highest = Math.max(highest, percent)
    lowest = Math.min(lowest, percent)
    cells.push([columnIndex, rowIndex, Number(percent.toPrecision(6))])
  }))
  const central: [number, number] = [nearestIndex(heatmap.s, heatmap.central.s, false), nearestIndex(heatmap.effectiveSize, heatmap.central.effectiveSize, true)]
  const min = Number.isFinite(lowest) ? Math.floor(lowest) : 0
  const max = Math.max(min + 1, Math.ceil(highest))
  // Dark cells get white figures so the text keeps its contrast; the scenario's cell is outlined.
  const data = cells.map(cell => ({
    value: cell,
    label: { color: cell[2] > min + 0.55 * (max - min) ? '#ffffff' : CHART_COLOURS.text, fontWeight: cell[0] === central[0] && cell[1] === central[1] ? 'bold' as const : 'normal' as const },
    ...(cell[0] === central[0] && cell[1] === central[1] ? { itemStyle: { borderColor: CHART_COLOURS.accent, borderWidth: 3 } } : {}),
  }))
  return {
    ...chartBase(options.animation ?? false),
    aria: {
      enabled: true,
      label: {
        description: `Establishment probability${heatmap.variantName ? ` of ${heatmap.variantName}` : ''} for s from ${sText(heatmap.s[0] ?? 0)} to ${sText(heatmap.s[heatmap.s.length - 1] ?? 0)} and Ne from ${neText(heatmap.effectiveSize[0] ?? 0)} to ${neText(heatmap.effectiveSize[heatmap.effectiveSize.length - 1] ?? 0)}; highest ${heatmapCellText(highest / 100)}%.`,
      },
    },
    grid: { left: 8, right: 16, top: 12, bottom: 64, containLabel: true },
    tooltip: {
      formatter: (params: unknown) => {
        const { value } = params as { value: [number, number, number] }
        const [column, row, percent] = value
        return `s = ${sText(heatmap.s[column] ?? 0)}, Ne = ${neText(heatmap.effectiveSize[row] ?? 0)}: ${heatmapCellText(percent / 100)}%`
      },
    },
    xAxis: {
      type: 'category',
      data: heatmap.s.map(sText),
      name: 'selection coefficient s',
      nameLocation: 'middle',
      nameGap: 26,
      splitArea: { show: false },
      axisTick: { show: false },
      axisLine: { lineStyle: { color: CHART_COLOURS.grid } },
      axisLabel: { color: CHART_COLOURS.axis, fontSize: 10.5 },
      nameTextStyle: { color: CHART_COLOURS.axis, fontSize: 11 },
    },
    yAxis: {
      type: 'category',
      data: heatmap.effectiveSize.map(neText),
      name: 'Ne',
      nameLocation: 'end',
      axisTick: { show: false },
      axisLine: { lineStyle: { color: CHART_COLOURS.grid } },
      axisLabel: { color: CHART_COLOURS.axis, fontSize: 10.5 },
      nameTextStyle: { color: CHART_COLOURS.axis, fontSize: 11 },
    },
    visualMap: {
      type: 'continuous',
      min,
      max,
      calculable: false,
      orient: 'horizontal',
      left: 'center',
      bottom: 0,
      itemWidth: 12,
      itemHeight: 180,
      text: [`${max}%`, `${min}%`],
      textStyle: { color: CHART_COLOURS.text, fontSize: 11 },
      inRange: { color: [...HEATMAP_COLOURS] },
      seriesIndex: 0,
    },
    series: [
      {
        name: 'Establishment probability (%)',
        type: 'heatmap',
        data,
        label: {
          show: true,
          fontSize: 9.5,
          formatter: (params: unknown) => heatmapCellText(((params as { value: [number, number, number] }).value[2]) / 100),
        },
        itemStyle: { borderColor: '#ffffff', borderWidth: 1 },
        emphasis: { itemStyle: { borderColor: CHART_COLOURS.text, borderWidth: 1 } },
      },
    ] as NonNullable<EChartsOption['series']>,
  }
}
