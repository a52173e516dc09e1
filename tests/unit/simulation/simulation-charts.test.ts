/**
 * The fan-chart option builders of simulation results (shared/charts/simulation-*.ts): bands
 * stack to the right edges, every series lines up with the generation axis, gaps stay gaps,
 * and the words (tooltip lines, summaries, headline) say what the numbers are. Built from real
 * engine results of small runs.
 */
import { describe, expect, it } from 'vitest'
import { simulateEstablishment, simulateRescue } from '../../../shared/genetics'
import { establishmentChartSummary, establishmentHeadline, establishmentTrajectoryChartOption } from '../../../shared/charts/simulation-establishment-chart'
import { rescueEffectChartOption, rescueEffectSummary, rescueMetricChartOption, rescueMetricSummary } from '../../../shared/charts/simulation-rescue-chart'
import { bandWidths, fanSeries, fanTooltipLine, generationLabels } from '../../../shared/charts/simulation-fan'

type Series = { name: string, data: (number | null)[], stack?: string, areaStyle?: unknown, markLine?: unknown }

const establishment = simulateEstablishment({
  census: 50, effectiveSize: 25, s: 0.1, h: 0.5, sourceFrequency: 0.5, migrantsPerEvent: 3, eventInterval: 3, events: 2, generations: 60,
}, { seed: 3, replicates: 300 })

const rescue = simulateRescue({
  recipient: { census: 20, effectiveRatio: 0.6, burnInGenerations: 20 },
  source: { census: 40, burnInGenerations: 20 },
  generations: 10, markerLoci: 64, load: { loci: 128 },
  adaptive: { s: 0.1, h: 0.5, sourceFrequency: 0.5 },
  translocation: { migrantsPerEvent: 3, eventInterval: 4, events: 2 },
}, { seed: 7, replicates: 8 })

describe('fan series', () => {
  it('bandWidths: upper − lower, null where either is missing, never negative', () => {
    expect(bandWidths([0.1, null, 0.5, 0.2], [0.4, 0.3, null, 0.1])).toEqual([expect.closeTo(0.3, 15), null, null, 0])
  })

  it('five series: two stacked bands (edge + width) and the median, whose sums give the quantiles back', () => {
    const quantiles = { q05: [0, 0.1], q25: [0.2, 0.3], q50: [0.4, 0.5], q75: [0.6, 0.7], q95: [0.9, 1] }
    const series = fanSeries('Frequency', quantiles, '#000000', 'k') as Series[]
    expect(series.map(s => s.stack)).toEqual(['k-outer', 'k-outer', 'k-inner', 'k-inner', undefined])
    const [outerEdge, outerWidth, innerEdge, innerWidth, median] = series
    quantiles.q95.forEach((top, i) => expect((outerEdge!.data[i] ?? 0) + (outerWidth!.data[i] ?? 0)).toBeCloseTo(top, 12))
    quantiles.q75.forEach((top, i) => expect((innerEdge!.data[i] ?? 0) + (innerWidth!.data[i] ?? 0)).toBeCloseTo(top, 12))
    expect(median!.name).toBe('Frequency')
    expect(median!.data).toEqual([0.4, 0.5])
  })

  it('tooltip line and axis labels', () => {
    const quantiles = { q05: [0.1, null], q25: [0.3, null], q50: [0.42, null], q75: [0.55, null], q95: [0.8, null] }
    expect(fanTooltipLine('Frequency', quantiles, 0, 2)).toBe('Frequency: median 0.42 (50 %: 0.30–0.55; 90 %: 0.10–0.80)')
    expect(fanTooltipLine('Frequency', quantiles, 1, 2)).toBe('Frequency: no replicate left')
    expect(generationLabels([0, 1, 2, 5], 2.5)).toEqual(['0', '2.5', '5', '13'])
    expect(generationLabels([0, 3])).toEqual(['0', '3'])
  })
})

describe('establishment chart', () => {
  it('one fan over the trajectory grid, frequency axis 0–1, labels in years when the generation time is given', () => {
    const option = establishmentTrajectoryChartOption(establishment, { generationTimeYears: 2 }) as { xAxis: { data: string[], name: string }, yAxis: { min: number, max: number }, series: Series[] }
    const grid = establishment.trajectoryQuantiles.generation
    expect(option.xAxis.data).toEqual(grid.map(g => String(g * 2 < 10 ? g * 2 : Math.round(g * 2))))
    expect(option.xAxis.name).toBe('years from the start')
    expect([option.yAxis.min, option.yAxis.max]).toEqual([0, 1])
    expect(option.series).toHaveLength(5)
    for (const series of option.series) expect(series.data).toHaveLength(grid.length)
    expect(option.series[4]!.data).toEqual(establishment.trajectoryQuantiles.q50)
  })

  it('headline and summary in words', () => {
    expect(establishmentHeadline({ replicates: 2000, established: 824, interval95: [0.39, 0.434] })).toBe('Established in 41.2 % of 2,000 replicates (95 % interval 39.0–43.4 %)')
    expect(establishmentChartSummary(establishment)).toMatch(/^Frequency of the variant in the recipient over time, over all replicates\. After 60 generations the median frequency is \d\.\d\d \(90 % of replicates between \d\.\d\d and \d\.\d\d\)\.$/)
  })
})

describe('rescue charts', () => {
  it('two fans per quantity (without: dashed teal; with: ochre), aligned with generations 0…G', () => {
    const option = rescueMetricChartOption(rescue, 'heterozygosity') as { xAxis: { data: string[] }, series: Series[], legend: { data: string[] } }
    expect(option.xAxis.data).toEqual(rescue.generation.map(String))
    expect(option.series).toHaveLength(10)
    expect(option.legend.data).toEqual(['With releases', 'Without releases'])
    expect(option.series[4]!.data).toEqual(rescue.withoutTranslocation.heterozygosity.q50)
    expect(option.series[9]!.data).toEqual(rescue.withTranslocation.heterozygosity.q50)
    expect(rescueMetricSummary(rescue, 'heterozygosity')).toMatch(/^Heterozygosity H over 10 generations, median over 8 replicates: \d\.\d{3} with releases and \d\.\d{3} without at the end\.$/)
  })

  it('rescue effect: the ratio fan with a reference line at 1', () => {
    const option = rescueEffectChartOption(rescue) as { series: Series[] }
    expect(option.series[4]!.data).toEqual(rescue.rescueEffect.q50)
    expect(option.series[4]!.markLine).toMatchObject({ data: [{ yAxis: 1 }] })
    expect(rescueEffectSummary(rescue)).toMatch(/^At the end, mean fitness with releases is \d+\.\d\d times that without/)
    const extinct = { ...rescue, rescueEffect: { ...rescue.rescueEffect, q50: rescue.rescueEffect.q50.map(() => null) } }
    expect(rescueEffectSummary(extinct)).toBe('No replicate kept a breeding recipient in both arms to the end.')
  })
})
