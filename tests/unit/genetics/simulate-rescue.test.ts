import { readFileSync } from 'node:fs'
import { describe, expect, it, vi } from 'vitest'
import { mergeRescuePartials, runRescueReplicates, simulateRescue, summarizeRescue } from '../../../shared/genetics/simulate/rescue'
import type { RescueParams, RescuePartial } from '../../../shared/genetics/simulate/rescue'
import { splitReplicates } from '../../../shared/genetics/simulate/replicate-ranges'
import { heterozygosityRetained, inbreedingTrajectory } from '../../../shared/genetics/drift'
import { rescuePlan } from '../../../shared/genetics/simulate/rescue/rescue-plan'
import { genomeArchitecture } from '../../../shared/genetics/simulate/rescue/architecture'
import { burnIn } from '../../../shared/genetics/simulate/rescue/burn-in'
import { evaluateFitness } from '../../../shared/genetics/simulate/rescue/evaluate'
import { measureGeneration } from '../../../shared/genetics/simulate/rescue/measure'
import { allocatePopulation } from '../../../shared/genetics/simulate/rescue/population'
import type { Population } from '../../../shared/genetics/simulate/rescue/population'
import { gameteScratch, writeGamete } from '../../../shared/genetics/simulate/rescue/gamete'
import { replicateStream, sharedStream, uniformIndex } from '../../../shared/genetics/simulate/random'

// Each test costs a few CPU-seconds; the wall-clock limit is generous for shared machines.
vi.setConfig({ testTimeout: 60_000 })

const fixture = JSON.parse(readFileSync(new URL('../../fixtures/genetics/simulate-rescue.json', import.meta.url), 'utf8')) as {
  closedPopulation: { census: number, effectiveRatio: number, generations: number, heterozygosityRatio: number, pedigreeInbreeding: number }
  familySizeVariance: { census: number, effectiveRatio: number, generations: number, heterozygosityRatio: number, pedigreeInbreeding: number }
  islandModel: { census: number, effectiveRatio: number, migrationRate: number, sourceCensus: number, generations: number, pedigreeInbreeding: Record<string, number> }
}

/** A neutral recipient (no load, no burn-in) with optional continuing migration. */
function neutralParams(census: number, effectiveRatio: number, generations: number, migrationRate = 0, sourceCensus = 2): RescueParams {
  return {
    recipient: { census, effectiveRatio, burnInGenerations: 0 },
    source: { census: sourceCensus, burnInGenerations: 0 },
    generations,
    markerLoci: 200,
    load: null,
    translocation: { migrantsPerEvent: 0, eventInterval: 1, events: 0, migrationRate },
  }
}

/** Values of one metric at generation t across replicates. */
function atGeneration(column: readonly number[], replicates: number, generations: number, t: number): number[] {
  return Array.from({ length: replicates }, (_, r) => column[r * (generations + 1) + t] ?? Number.NaN)
}

function meanAndError(values: number[]): { mean: number, standardError: number } {
  const mean = values.reduce((a, b) => a + b, 0) / values.length
  const variance = values.reduce((a, b) => a + (b - mean) ** 2, 0) / (values.length - 1)
  return { mean, standardError: Math.sqrt(variance / values.length) }
}

/** Ratio of mean H_t to mean H_0 over replicates, with its delta-method standard error. */
function heterozygosityRatio(partial: RescuePartial, t: number): { ratio: number, standardError: number } {
  const { replicates, generations } = partial
  const start = atGeneration(partial.withoutTranslocation.heterozygosity, replicates, generations, 0)
  const end = atGeneration(partial.withoutTranslocation.heterozygosity, replicates, generations, t)
  const base = meanAndError(start).mean
  const ratios = end.map((value, r) => value / (start[r] ?? Number.NaN))
  const { standardError } = meanAndError(ratios)
  return { ratio: meanAndError(end).mean / base, standardError }
}

describe('simulateRescue: neutral heterozygosity and inbreeding in a closed population', () => {
  const c = fixture.closedPopulation
  const replicates = 150
  const partial = runRescueReplicates(neutralParams(c.census, c.effectiveRatio, c.generations), { seed: 5, firstReplicate: 0, replicates })

  it('H decays as (1 − 1/2Ne)^t (Wright 1931, SCIENCE.md eq. 4.1)', () => {
    const { ratio, standardError } = heterozygosityRatio(partial, c.generations)
    // Exact expectation for two sexes and no selfing (fixture), sampling error only.
    expect(Math.abs(ratio - c.heterozygosityRatio)).toBeLessThanOrEqual(4 * standardError)
    // Wright's monoecious formula, plus its difference from the dioecious expectation (0.3 % here).
    const wright = heterozygosityRetained({ effectiveSize: c.census, generations: c.generations })
    expect(Math.abs(ratio - wright)).toBeLessThanOrEqual(4 * standardError + Math.abs(c.heterozygosityRatio - wright))
  })

  it('marker F (1 − H_t/H_0) and pedigree F both follow the expected rise of inbreeding', () => {
    const t = c.generations
    const marker = meanAndError(atGeneration(partial.withoutTranslocation.markerInbreeding, replicates, c.generations, t))
    const pedigree = meanAndError(atGeneration(partial.withoutTranslocation.pedigreeInbreeding, replicates, c.generations, t))
    expect(Math.abs(marker.mean - (1 - c.heterozygosityRatio))).toBeLessThanOrEqual(4 * marker.standardError)
    expect(Math.abs(pedigree.mean - c.pedigreeInbreeding)).toBeLessThanOrEqual(4 * pedigree.standardError)
    // Without selfing F lags Wright's F_t by one generation: F_t ≈ F^Wright_(t−1).
    const wright = inbreedingTrajectory({ effectiveSize: c.census, generations: t })[t - 1] ?? Number.NaN
    expect(Math.abs(pedigree.mean - wright)).toBeLessThanOrEqual(4 * pedigree.standardError + 0.01 * wright)
  })

  it('without gene flow the two arms are identical and the rescue effect is exactly 1', () => {
    expect(partial.withTranslocation).toEqual(partial.withoutTranslocation)
    const result = summarizeRescue(partial)
    expect(result.rescueEffect.q05.every(value => value === 1)).toBe(true)
    expect(result.rescueEffect.q95.every(value => value === 1)).toBe(true)
  })
})

describe('simulateRescue: realised Ne from family-size variance', () => {
  const c = fixture.familySizeVariance
  it(`Ne estimated from H decay matches the target Ne/N = ${c.effectiveRatio}`, () => {
    const replicates = 150
    const partial = runRescueReplicates(neutralParams(c.census, c.effectiveRatio, c.generations), { seed: 21, firstReplicate: 0, replicates })
    const { ratio, standardError } = heterozygosityRatio(partial, c.generations)
    const estimate = (r: number): number => 1 / (2 * (1 - r ** (1 / c.generations)))
    const target = c.effectiveRatio * c.census
    // Propagate the ratio's error to Ne: |dNe| ≈ |d ln r| / |ln r| · Ne.
    const neError = standardError / ratio / Math.abs(Math.log(ratio)) * estimate(ratio)
    expect(Math.abs(estimate(ratio) - estimate(c.heterozygosityRatio))).toBeLessThanOrEqual(4 * neError)
    expect(Math.abs(estimate(ratio) - target)).toBeLessThanOrEqual(4 * neError + Math.abs(estimate(c.heterozygosityRatio) - target))
    const pedigree = meanAndError(atGeneration(partial.withoutTranslocation.pedigreeInbreeding, replicates, c.generations, c.generations))
    expect(Math.abs(pedigree.mean - c.pedigreeInbreeding)).toBeLessThanOrEqual(4 * pedigree.standardError)
  })
})

describe('simulateRescue: island model with continuing migration', () => {
  const c = fixture.islandModel
  it('pedigree F follows the island-model recurrence (SCIENCE.md eq. 4.2)', () => {
    const replicates = 120
    const partial = runRescueReplicates(neutralParams(c.census, c.effectiveRatio, c.generations, c.migrationRate, c.sourceCensus), { seed: 8, firstReplicate: 0, replicates })
    const wright = inbreedingTrajectory({ effectiveSize: c.census, generations: c.generations, migrationRate: c.migrationRate })
    for (const [generation, expected] of Object.entries(c.pedigreeInbreeding)) {
      const t = Number(generation)
      const simulated = meanAndError(atGeneration(partial.withTranslocation.pedigreeInbreeding, replicates, c.generations, t))
      expect(Math.abs(simulated.mean - expected)).toBeLessThanOrEqual(4 * simulated.standardError)
      // Two sexes, no selfing: the offspring's F is (1 − m)² × the residents' kinship, which
      // eq. 4.2 gives one generation earlier; the two agree within 1.1 % (fixture vs formula).
      const lagged = (1 - c.migrationRate) ** 2 * (wright[t - 1] ?? Number.NaN)
      expect(Math.abs(simulated.mean - lagged)).toBeLessThanOrEqual(4 * simulated.standardError + 0.011 * lagged)
    }
    // Gene flow keeps F far below the isolated arm's.
    const isolated = meanAndError(atGeneration(partial.withoutTranslocation.pedigreeInbreeding, replicates, c.generations, c.generations))
    expect(isolated.mean).toBeGreaterThan(5 * (c.pedigreeInbreeding['40'] ?? 0))
  })
})

describe('simulateRescue: inbreeding depression from the load', () => {
  it('the slope of ln mean fitness on F matches the lethal equivalents B (Morton, Crow & Muller 1956)', () => {
    const plan = rescuePlan('test', {
      recipient: { census: 200, burnInGenerations: 200 }, source: { census: 2 }, generations: 1, markerLoci: 32,
      load: { loci: 2000, mutationRate: 0.3, meanSelection: 0.1, selectionShape: 0.5, meanDominance: 0.2 },
      translocation: { migrantsPerEvent: 0, eventInterval: 1, events: 0 },
    })
    const architecture = genomeArchitecture(plan, sharedStream(3))
    const random = replicateStream(3, 0)
    const population = burnIn(plan.recipient, architecture, random) as Population
    const inbreedingLoad = measureGeneration(population, evaluateFitness(population, architecture, null), architecture).inbreedingLoad
    // Offspring are formed without new mutations, so only the standing load is expressed.
    const meiosis = { ...architecture, mutationRate: 0 }
    const scratch = gameteScratch(meiosis)
    const females: number[] = []
    const males: number[] = []
    for (let i = 0; i < population.size; i++) (population.male[i] === 1 ? males : females).push(i)
    const pick = (list: number[]): number => list[uniformIndex(random, list.length)] ?? 0
    const count = 12_000
    // F = 0 relative to the current population: offspring of random pairs.
    const outbred = allocatePopulation(count, meiosis)
    // F = ¼: offspring of full sibs.
    const siblings = allocatePopulation(2 * count, meiosis)
    const inbred = allocatePopulation(count, meiosis)
    for (let k = 0; k < count; k++) {
      writeGamete(population, pick(females), outbred, k, 0, meiosis, random, scratch)
      writeGamete(population, pick(males), outbred, k, 1, meiosis, random, scratch)
      const mother = pick(females)
      const father = pick(males)
      for (const sibling of [2 * k, 2 * k + 1]) {
        writeGamete(population, mother, siblings, sibling, 0, meiosis, random, scratch)
        writeGamete(population, father, siblings, sibling, 1, meiosis, random, scratch)
      }
      writeGamete(siblings, 2 * k, inbred, k, 0, meiosis, random, scratch)
      writeGamete(siblings, 2 * k + 1, inbred, k, 1, meiosis, random, scratch)
    }
    const logMean = (group: Population): { value: number, standardError: number } => {
      const { mean, standardError } = meanAndError(Array.from(evaluateFitness(group, meiosis, null)))
      return { value: Math.log(mean), standardError: standardError / mean }
    }
    const base = logMean(outbred)
    const full = logMean(inbred)
    const slope = (full.value - base.value) / 0.25
    const slopeError = Math.hypot(base.standardError, full.standardError) / 0.25
    expect(inbreedingLoad).toBeGreaterThan(0.5)
    // ln W = ln W0 − B·F; B here is first order in s and assumes linkage equilibrium: allow 10 %.
    expect(Math.abs(-slope - inbreedingLoad)).toBeLessThanOrEqual(4 * slopeError + 0.1 * inbreedingLoad)
  })
})

describe('simulateRescue: translocation from a large source', () => {
  const params: RescueParams = {
    recipient: { census: 30, effectiveRatio: 0.5, burnInCensus: 30, burnInGenerations: 60 },
    source: { census: 200, burnInGenerations: 60 },
    generations: 15,
    markerLoci: 64,
    load: { loci: 500, mutationRate: 0.3, meanSelection: 0.1, selectionShape: 0.5, meanDominance: 0.2 },
    adaptive: { s: 0.3, h: 0.5, sourceFrequency: 1 },
    translocation: { migrantsPerEvent: 4, eventInterval: 3, events: 5 },
  }
  const result = simulateRescue(params, { seed: 17, replicates: 24 })
  const last = params.generations

  it('restores heterozygosity, lowers F and raises fitness (rescue effect > 1)', () => {
    expect(result.withTranslocation.pedigreeInbreeding.q50[last] ?? 1).toBeLessThan(result.withoutTranslocation.pedigreeInbreeding.q50[last] ?? 0)
    expect(result.withTranslocation.heterozygosity.mean[last] ?? 0).toBeGreaterThan(result.withoutTranslocation.heterozygosity.mean[last] ?? 1)
    expect(result.rescueEffect.q50[last] ?? 0).toBeGreaterThan(1)
    // Marker F shares its base (the residents before the first event) in both arms.
    expect(result.withoutTranslocation.markerInbreeding.q50[0]).toBe(0)
    expect(result.withTranslocation.markerInbreeding.q50[last] ?? 1).toBeLessThan(result.withoutTranslocation.markerInbreeding.q50[last] ?? 0)
  })

  it('brings in the adaptive variant only with translocation', () => {
    expect(result.withTranslocation.adaptiveFrequency.q50[last] ?? 0).toBeGreaterThan(0)
    expect(result.withoutTranslocation.adaptiveFrequency.q95[last]).toBe(0)
    // Generation 0 of the arm with an event at 0 counts the 4 migrants: census 34.
    expect(result.withTranslocation.census.q50[0]).toBe(34)
    expect(result.withoutTranslocation.census.q50[0]).toBe(30)
  })

  it('reports ordered bands and every replicate', () => {
    expect(result.replicates).toBe(24)
    expect(result.generation).toHaveLength(last + 1)
    const bands = result.withTranslocation.meanFitness
    bands.q50.forEach((median, t) => {
      expect(bands.q05[t] ?? 0).toBeLessThanOrEqual(median ?? 0)
      expect(median ?? 0).toBeLessThanOrEqual(bands.q95[t] ?? 0)
    })
    expect(result.extinct).toEqual({ withTranslocation: 0, withoutTranslocation: 0 })
  })
})

describe('simulateRescue: replicate blocks', () => {
  const params: RescueParams = {
    recipient: { census: 20, burnInGenerations: 10 },
    source: { census: 40, burnInGenerations: 10 },
    generations: 6,
    markerLoci: 40,
    load: { loci: 100 },
    adaptive: { s: 0.2, h: 0.5, sourceFrequency: 0.5 },
    translocation: { migrantsPerEvent: 2, eventInterval: 2, events: 3, migrationRate: 0.05 },
    map: { chromosomes: 3, chromosomeLength: 0.5 },
  }

  it('give identical results whether run as 1 × 8, 4 × 2 or 3 uneven blocks in any order', () => {
    const whole = runRescueReplicates(params, { seed: 4, firstReplicate: 0, replicates: 8 })
    const pairs = [0, 2, 4, 6].map(first => runRescueReplicates(params, { seed: 4, firstReplicate: first, replicates: 2 }))
    const uneven = splitReplicates(8, 3).map(range => runRescueReplicates(params, { seed: 4, firstReplicate: range.first, replicates: range.count }))
    expect(mergeRescuePartials([...pairs].reverse())).toEqual(whole)
    expect(summarizeRescue(mergeRescuePartials(uneven))).toEqual(summarizeRescue(whole))
    expect(simulateRescue(params, { seed: 4, replicates: 8 })).toEqual(summarizeRescue(whole))
  })

  it('survive a JSON round trip', () => {
    const partial = runRescueReplicates(params, { seed: 4, firstReplicate: 0, replicates: 2 })
    const copy = JSON.parse(JSON.stringify(partial)) as RescuePartial
    expect(summarizeRescue(copy)).toEqual(summarizeRescue(partial))
  })

  it('report progress and reject bad inputs', () => {
    const progress: number[] = []
    simulateRescue(params, { seed: 1, replicates: 3, onProgress: done => progress.push(done) })
    expect(progress).toEqual([1, 2, 3])
    const options = { seed: 1, replicates: 1 }
    expect(() => simulateRescue({ ...params, generations: 0 }, options)).toThrow('simulateRescue: generations must be an integer ≥ 1, got 0')
    expect(() => simulateRescue({ ...params, recipient: { census: 1 } }, options)).toThrow('recipient.census must be an integer ≥ 2, got 1')
    expect(() => simulateRescue({ ...params, recipient: { census: 20, effectiveRatio: 1.5 } }, options)).toThrow(RangeError)
    expect(() => simulateRescue({ ...params, load: { meanDominance: 0.7 } }, options)).toThrow('load.meanDominance')
    expect(() => simulateRescue({ ...params, translocation: { ...params.translocation, migrantsPerEvent: 100 } }, options)).toThrow('migrantsPerEvent')
    expect(() => simulateRescue(params, { seed: 1, replicates: 0 })).toThrow(RangeError)
  })
})
