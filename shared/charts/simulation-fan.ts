/**
 * Fan charts of simulation results: the median of a quantity over replicates as a line, with
 * the 25–75 % band (darker) and the 5–95 % band (lighter) around it, generation by generation.
 * Shared by the establishment and rescue charts (shared/charts/simulation-*-chart.ts).
 *
 * ECharts draws a band as two stacked series: the lower edge (invisible) and the width
 * (upper − lower) with a filled area on top of it. Generations form a category axis, so every
 * series of a chart is aligned point by point. A missing value (null: no replicate left, e.g.
 * after extinction) leaves a gap.
 */
/** Quantiles of one quantity per generation (nulls where no replicate has a value). */
export interface FanQuantiles {
  q05: readonly (number | null)[]
  q25: readonly (number | null)[]
  q50: readonly (number | null)[]
  q75: readonly (number | null)[]
  q95: readonly (number | null)[]
}

/** A line series or one of the stacked band series, as the chart options use them. */
export type FanSeries = Record<string, unknown> & { name: string, type: 'line', data: (number | null)[] }

/** upper − lower, point by point (null where either is missing). */
export function bandWidths(lower: readonly (number | null)[], upper: readonly (number | null)[]): (number | null)[] {
  return lower.map((low, index) => {
    const high = upper[index]
    return low === null || high === null || high === undefined ? null : Math.max(0, high - low)
  })
}

/**
 * The five series of one fan: 5–95 % band, 25–75 % band, median line.
 *
 * @param name - the quantity's name in the legend ('With releases')
 * @param quantiles - per-generation quantiles, all of the same length
 * @param colour - line and band colour (hex)
 * @param stackKey - unique per fan in a chart (bands of different fans must not stack together)
 * @param dashed - dashed median line (the second fan of a chart)
 * @returns series in drawing order; only the median line shows in the legend
 */
export function fanSeries(name: string, quantiles: FanQuantiles, colour: string, stackKey: string, dashed = false): FanSeries[] {
  const edge = (data: readonly (number | null)[], stack: string): FanSeries => ({
    name: `${name} (band edge)`,
    type: 'line',
    data: [...data],
    stack,
    symbol: 'none',
    lineStyle: { opacity: 0 },
    silent: true,
    tooltip: { show: false },
  })
  const band = (lower: readonly (number | null)[], upper: readonly (number | null)[], stack: string, opacity: number): FanSeries => ({
    name: `${name} (band)`,
    type: 'line',
    data: bandWidths(lower, upper),
    stack,
    symbol: 'none',
    lineStyle: { opacity: 0 },
    areaStyle: { color: colour, opacity },
    silent: true,
    tooltip: { show: false },
  })
  return [
    edge(quantiles.q05, `${stackKey}-outer`),
    band(quantiles.q05, quantiles.q95, `${stackKey}-outer`, 0.12),
    edge(quantiles.q25, `${stackKey}-inner`),
    band(quantiles.q25, quantiles.q75, `${stackKey}-inner`, 0.28),
    {
      name,
      type: 'line',
      data: [...quantiles.q50],
      showSymbol: false,
      lineStyle: { color: colour, width: 2.25, type: dashed ? 'dashed' : 'solid' },
      itemStyle: { color: colour },
      connectNulls: false,
    },
  ]
}

/**
 * Labels of the generation axis: generation numbers, or years from now when the generation
 * time is known (rounded to one decimal below 10 years, whole years above).
 *
 * @example generationLabels([0, 1, 2], 2.5) // ['0', '2.5', '5']
 * @example generationLabels([0, 10], undefined) // ['0', '10']
 */
export function generationLabels(generations: readonly number[], generationTimeYears?: number): string[] {
  if (!generationTimeYears) return generations.map(String)
  return generations.map((generation) => {
    const years = generation * generationTimeYears
    return String(years < 10 ? Math.round(years * 10) / 10 : Math.round(years))
  })
}

/** A number for a tooltip: fixed digits, or '—' when missing. */
export function formatValue(value: number | null | undefined, digits: number): string {
  return typeof value === 'number' && Number.isFinite(value) ? value.toFixed(digits) : '—'
}

/**
 * One tooltip line of a fan at a point: "name: median 0.42 (50 %: 0.30–0.55; 90 %: 0.10–0.80)".
 *
 * @example fanTooltipLine('Frequency', { q05: [0.1], q25: [0.3], q50: [0.42], q75: [0.55], q95: [0.8] }, 0, 2)
 *   // 'Frequency: median 0.42 (50 %: 0.30–0.55; 90 %: 0.10–0.80)'
 */
export function fanTooltipLine(name: string, quantiles: FanQuantiles, index: number, digits: number): string {
  const median = quantiles.q50[index]
  if (median === null || median === undefined) return `${name}: no replicate left`
  const value = (series: readonly (number | null)[]) => formatValue(series[index], digits)
  return `${name}: median ${value(quantiles.q50)} (50 %: ${value(quantiles.q25)}–${value(quantiles.q75)}; 90 %: ${value(quantiles.q05)}–${value(quantiles.q95)})`
}
