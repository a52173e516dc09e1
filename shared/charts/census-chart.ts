/**
 * The census chart: adults counted each year as a stacked bar of males, females and adults not
 * sexed, so the height of every bar is the adult count. Years without a census keep their
 * place on the axis (an empty slot), so gaps in the series are visible.
 *
 * Pure: the record page renders the option with vue-echarts, the PDF brief with ECharts' SVG
 * renderer on the server. Tooltip formatters are plain functions of the data.
 */
import type { EChartsOption } from 'echarts'
import { axisStyle, chartBase, CHART_COLOURS } from './chart-theme'

/** What the chart needs of a census row. */
export interface CensusChartRow {
  year: number
  adults: number
  males: number | null
  females: number | null
}

/** One year of the chart: the three stacked parts (null where the year has no census). */
export interface CensusChartSlot {
  year: number
  adults: number | null
  males: number | null
  females: number | null
  notSexed: number | null
}

/**
 * Every year from the first to the last census, with the parts of each bar. Males or females
 * that were not recorded count as "not sexed".
 *
 * @param rows - census rows in any order (one per year)
 * @returns slots in year order; [] when there are no rows
 * @example censusChartSlots([{ year: 2020, adults: 10, males: 4, females: 5 }, { year: 2022, adults: 8, males: null, females: null }])
 *   // [{ year: 2020, adults: 10, males: 4, females: 5, notSexed: 1 },
 *   //  { year: 2021, adults: null, … }, { year: 2022, adults: 8, males: null, females: null, notSexed: 8 }]
 */
export function censusChartSlots(rows: readonly CensusChartRow[]): CensusChartSlot[] {
  if (rows.length === 0) return []
  const byYear = new Map(rows.map(row => [row.year, row]))
  const years = rows.map(row => row.year)
  const first = Math.min(...years)
  const last = Math.max(...years)
  const slots: CensusChartSlot[] = []
  for (let year = first; year <= last; year++) {
    const row = byYear.get(year)
    if (!row) {
      slots.push({ year, adults: null, males: null, females: null, notSexed: null })
      continue
    }
    const sexed = (row.males ?? 0) + (row.females ?? 0)
    slots.push({ year, adults: row.adults, males: row.males, females: row.females, notSexed: Math.max(0, row.adults - sexed) })
  }
  return slots
}

/** The tooltip line of one year, e.g. "2024: 153 adults (70 males, 71 females, 12 not sexed)". */
export function censusSlotSummary(slot: CensusChartSlot): string {
  if (slot.adults === null) return `${slot.year}: no census`
  const parts: string[] = []
  if (slot.males !== null) parts.push(`${slot.males} males`)
  if (slot.females !== null) parts.push(`${slot.females} females`)
  if (parts.length > 0 && slot.notSexed) parts.push(`${slot.notSexed} not sexed`)
  const detail = parts.length > 0 ? ` (${parts.join(', ')})` : ' (not sexed)'
  return `${slot.year}: ${slot.adults} adult${slot.adults === 1 ? '' : 's'}${detail}`
}

/**
 * ECharts option for the census chart.
 *
 * @param rows - census rows (any order)
 * @param options.animation - animate (page) or not (server rendering); default false
 * @returns a complete option (category x axis of years, value y axis of adults, three stacked bar series)
 */
export function censusChartOption(rows: readonly CensusChartRow[], options: { animation?: boolean } = {}): EChartsOption {
  const slots = censusChartSlots(rows)
  const part = (name: string, colour: string, pick: (slot: CensusChartSlot) => number | null) => ({
    name,
    type: 'bar' as const,
    stack: 'adults',
    barMaxWidth: 28,
    itemStyle: { color: colour },
    emphasis: { focus: 'series' as const },
    data: slots.map(pick),
  })
  return {
    ...chartBase(options.animation ?? false),
    aria: { enabled: true, label: { description: `Adults counted per year, ${slots.length ? `${slots[0]?.year}–${slots[slots.length - 1]?.year}` : 'no census yet'}.` } },
    grid: { left: 8, right: 16, top: 40, bottom: 8, containLabel: true },
    legend: { top: 0, left: 0, itemWidth: 12, itemHeight: 12, textStyle: { color: CHART_COLOURS.text, fontSize: 12 } },
    tooltip: {
      trigger: 'axis',
      axisPointer: { type: 'shadow' },
      formatter: (params: unknown) => {
        const first = Array.isArray(params) ? params[0] as { dataIndex?: number } : undefined
        const slot = first?.dataIndex === undefined ? undefined : slots[first.dataIndex]
        return slot ? censusSlotSummary(slot) : ''
      },
    },
    xAxis: { type: 'category', data: slots.map(slot => String(slot.year)), ...axisStyle(), splitLine: { show: false } },
    yAxis: { type: 'value', minInterval: 1, ...axisStyle() },
    series: [
      part('Males', CHART_COLOURS.primarySoft, slot => slot.males),
      part('Females', CHART_COLOURS.accent, slot => slot.females),
      part('Adults not sexed', CHART_COLOURS.quiet, slot => slot.notSexed),
    ],
  }
}
