/**
 * Sensitivity view (shared/proposals/sensitivity.ts): tornado ordering, bar ends equal to the
 * establishment and projection functions at the range ends, and the heat map's grid and
 * monotone behaviour.
 */
import { describe, expect, it } from 'vitest'
import { computeScenarioResults } from '#shared/proposals/results'
import { scheduleEstablishment } from '#shared/proposals/establishment'
import { defaultEffectiveSizeRange, establishmentHeatmap, sortTornadoBars, tornado } from '#shared/proposals/sensitivity'
import type { TornadoBar } from '#shared/proposals/sensitivity'
import type { RecipientFigures, ScenarioInputsLike } from '#shared/proposals/types'

const recipient: RecipientFigures = { census: 150, effectiveSize: 40, generationTimeYears: 3, initialInbreeding: 0 }
const inputs: ScenarioInputsLike = {
  schedule: { animalsPerEvent: 4, females: 2, males: 2, intervalYears: 5, events: 3, firstEventYear: 0 },
  variants: [{ name: 'cold tolerance', sourceFrequency: 0.4, s: 0.05, sRange: [0.01, 0.2], h: 0.5, hRange: [0.3, 0.7] }],
  load: { diploidLethalEquivalents: 12, range: [3.1, 30.3], citation: 'wildMammalsAndBirdsLifeHistory' },
  horizonYears: 50,
}

describe('tornado', () => {
  it('sorts by decreasing swing, inputs without effect last', () => {
    const bar = (input: TornadoBar['input'], swing: number, affects = true): TornadoBar =>
      ({ input, label: input, lowInput: 0, highInput: 1, lowValue: 0, highValue: swing, swing, affects })
    const sorted = sortTornadoBars([bar('h', 0.01), bar('lethalEquivalents', 0, false), bar('s', 0.2), bar('effectiveSize', 0.05)])
    expect(sorted.map(item => item.input)).toEqual(['s', 'effectiveSize', 'h', 'lethalEquivalents'])
  })

  it('establishment: bars end at the establishment probability of each range end; s (0.01–0.2) swings more than h (0.3–0.7)', () => {
    const result = tornado('establishment', { recipient, inputs })
    const central = scheduleEstablishment({ census: 150, effectiveSize: 40, s: 0.05, h: 0.5, animals: 4, sourceFrequency: 0.4, releases: 3 })
    expect(result.central).toBe(central)
    expect(result.bars.map(item => item.input)).toEqual(['s', 'effectiveSize', 'h', 'lethalEquivalents'])
    const sBar = result.bars[0]!
    expect(sBar.lowValue).toBe(scheduleEstablishment({ census: 150, effectiveSize: 40, s: 0.01, h: 0.5, animals: 4, sourceFrequency: 0.4, releases: 3 }))
    expect(sBar.highValue).toBe(scheduleEstablishment({ census: 150, effectiveSize: 40, s: 0.2, h: 0.5, animals: 4, sourceFrequency: 0.4, releases: 3 }))
    const neBar = result.bars.find(item => item.input === 'effectiveSize')!
    expect([neBar.lowInput, neBar.highInput]).toEqual([20, 80])
    expect(result.bars[3]).toMatchObject({ input: 'lethalEquivalents', affects: false, swing: 0 })
    for (let index = 1; index < 3; index++) expect(result.bars[index - 1]!.swing).toBeGreaterThanOrEqual(result.bars[index]!.swing)
  })

  it('fitness: lethal equivalents and Ne matter, s and h do not; bar ends equal the projection at the horizon', () => {
    const result = tornado('fitness', { recipient, inputs })
    const high = computeScenarioResults({ recipient, inputs: { ...inputs, load: { ...inputs.load, diploidLethalEquivalents: 30.3 } } }, { exactVector: null })
    const lethal = result.bars.find(item => item.input === 'lethalEquivalents')!
    expect(lethal.highValue).toBe(high.projection.atHorizon.fitnessWith)
    expect(result.bars.filter(item => item.affects).map(item => item.input).sort()).toEqual(['effectiveSize', 'lethalEquivalents'])
    expect(result.bars.slice(2).every(item => !item.affects)).toBe(true)
  })
})

describe('establishment heat map', () => {
  it('spans the s range linearly and the Ne range logarithmically', () => {
    const map = establishmentHeatmap({ recipient, inputs }, { s: 5, effectiveSize: 3 })
    expect(map.s).toEqual([0.01, 0.0575, 0.105, 0.1525, 0.2].map(value => expect.closeTo(value, 14)))
    expect(map.effectiveSize).toEqual([20, 40, 80].map(value => expect.closeTo(value, 12)))
    expect(map.values).toHaveLength(3)
    expect(map.values[1]![0]).toBe(scheduleEstablishment({ census: 150, effectiveSize: 40, s: 0.01, h: 0.5, animals: 4, sourceFrequency: 0.4, releases: 3 }))
  })

  it('rises with s and with Ne for an advantageous variant', () => {
    const map = establishmentHeatmap({ recipient, inputs })
    for (const row of map.values) for (let column = 1; column < row.length; column++) expect(row[column]!).toBeGreaterThan(row[column - 1]!)
    for (let row = 1; row < map.values.length; row++) expect(map.values[row]![5]!).toBeGreaterThan(map.values[row - 1]![5]!)
  })

  it('default Ne range: half to twice, or the census-ratio range when Ne came from the census', () => {
    expect(defaultEffectiveSizeRange(40, 400)).toEqual([20, 80])
    expect(defaultEffectiveSizeRange(40, 400, true)).toEqual([20, expect.closeTo(120, 12)])
  })
})
