/**
 * The record page's projections (shared/charts/projection-series.ts): F with and without gene
 * flow against the engine's own check values (tests/fixtures/genetics/
 * drift-science-check-values.json: independent mpmath reference computation, SCIENCE.md §4, §11),
 * the years → generations conversion, H = 1 − F, fitness = exp(−(2B/2)·F) (Morton, Crow & Muller
 * 1956, SCIENCE.md eq. 6.1, recomputed here), migration-rate entry, and properties (gene flow
 * never raises F; F rises and fitness falls over time).
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { migrationRateFromEntry, projectionPointAt, projectSubpopulation } from '../../../shared/charts/projection-series'
import drift from '../../fixtures/genetics/drift-science-check-values.json'

interface FixtureCase { function: string, input: Record<string, number>, expected: number, tolerance: { absolute?: number, relative?: number } }
const cases = drift.cases as unknown as FixtureCase[]

function allowed(entry: FixtureCase): number {
  return entry.tolerance.absolute ?? (entry.tolerance.relative ?? 0) * Math.abs(entry.expected)
}

describe('projectSubpopulation against the drift check values', () => {
  const fromZero = cases.filter(entry => entry.function === 'inbreedingAfter' && !entry.input.initialInbreeding && Number.isInteger(entry.input.generations))

  it(`reproduces ${fromZero.length} inbreedingAfter values (one generation per year, F from 0)`, () => {
    expect(fromZero.length).toBeGreaterThan(20)
    for (const entry of fromZero) {
      const { effectiveSize, generations, migrationRate = 0 } = entry.input as { effectiveSize: number, generations: number, migrationRate?: number }
      const projection = projectSubpopulation({ effectiveSize, generationTimeYears: 1, horizonYears: generations, migrationRate, diploidLethalEquivalents: 12 })
      const series = migrationRate > 0 ? projection.withGeneFlow : projection.isolated
      const point = series?.[generations]
      expect(point, JSON.stringify(entry.input)).toBeDefined()
      expect(Math.abs(point!.inbreeding - entry.expected), JSON.stringify(entry.input)).toBeLessThanOrEqual(allowed(entry))
    }
  })

  it('reports the island-model equilibrium and Ne·m of the gene-flow series', () => {
    for (const entry of cases.filter(c => c.function === 'equilibriumInbreeding')) {
      const { effectiveSize, migrationRate } = entry.input as { effectiveSize: number, migrationRate: number }
      const projection = projectSubpopulation({ effectiveSize, generationTimeYears: 5, horizonYears: 50, migrationRate, diploidLethalEquivalents: 3.14 })
      expect(Math.abs(projection.equilibriumInbreeding! - entry.expected)).toBeLessThanOrEqual(allowed(entry))
    }
    for (const entry of cases.filter(c => c.function === 'migrantsPerGeneration')) {
      const { effectiveSize, migrationRate } = entry.input as { effectiveSize: number, migrationRate: number }
      const projection = projectSubpopulation({ effectiveSize, generationTimeYears: 5, horizonYears: 50, migrationRate, diploidLethalEquivalents: 3.14 })
      expect(Math.abs(projection.migrantsPerGeneration - entry.expected)).toBeLessThanOrEqual(allowed(entry))
    }
  })

  it('converts years to generations with the generation time (generationsFromYears check values)', () => {
    for (const entry of cases.filter(c => c.function === 'generationsFromYears')) {
      const { years, generationTime } = entry.input as { years: number, generationTime: number }
      const projection = projectSubpopulation({ effectiveSize: 50, generationTimeYears: generationTime, horizonYears: years, migrationRate: 0, diploidLethalEquivalents: 12 })
      expect(Math.abs(projection.horizonGenerations - entry.expected)).toBeLessThanOrEqual(allowed(entry))
      expect(projection.wholeGenerations).toBe(entry.expected)
    }
  })
})

describe('projectSubpopulation: conversions and derived quantities', () => {
  it('steps in whole generations up to the horizon and says how far that reaches', () => {
    // 50 / 3 = 16.67 generations → 16 whole generations = 48 years (exact arithmetic).
    const p = projectSubpopulation({ effectiveSize: 346, generationTimeYears: 3, horizonYears: 50, migrationRate: 0.01, diploidLethalEquivalents: 12 })
    expect(p.horizonGenerations).toBeCloseTo(50 / 3, 12)
    expect(p.wholeGenerations).toBe(16)
    expect(p.wholeGenerationYears).toBe(48)
    expect(p.isolated.map(point => point.generation)).toEqual(Array.from({ length: 17 }, (_, i) => i))
    expect(p.isolated.map(point => point.years)).toEqual(Array.from({ length: 17 }, (_, i) => 3 * i))
    // 50 / 2.5 is 20 in exact arithmetic; the floor must not lose a generation to rounding.
    expect(projectSubpopulation({ effectiveSize: 50, generationTimeYears: 2.5, horizonYears: 50, migrationRate: 0, diploidLethalEquivalents: 12 }).wholeGenerations).toBe(20)
    // A generation longer than the horizon leaves only today.
    const long = projectSubpopulation({ effectiveSize: 50, generationTimeYears: 60, horizonYears: 50, migrationRate: 0, diploidLethalEquivalents: 12 })
    expect(long.wholeGenerations).toBe(0)
    expect(long.isolated).toEqual([{ generation: 0, years: 0, inbreeding: 0, heterozygosity: 1, fitness: 1 }])
  })

  it('has H = 1 − F and fitness = exp(−(2B/2)·F) at every point (SCIENCE.md eq. 4.1, 6.1)', () => {
    const p = projectSubpopulation({ effectiveSize: 12, generationTimeYears: 2.2, horizonYears: 50, migrationRate: 0.05, diploidLethalEquivalents: 3.14 })
    for (const point of [...p.isolated, ...p.withGeneFlow!]) {
      expect(point.heterozygosity).toBe(1 - point.inbreeding)
      expect(point.fitness).toBeCloseTo(Math.exp(-(3.14 / 2) * point.inbreeding), 14)
    }
    // Isolated at Ne = 12: F_t = 1 − (1 − 1/24)^t, written out here.
    expect(p.isolated[22]!.inbreeding).toBeCloseTo(1 - (1 - 1 / 24) ** 22, 13)
  })

  it('leaves out the gene-flow series when m = 0', () => {
    const p = projectSubpopulation({ effectiveSize: 40, generationTimeYears: 4, horizonYears: 50, migrationRate: 0, diploidLethalEquivalents: 12 })
    expect(p.withGeneFlow).toBeNull()
    expect(p.equilibriumInbreeding).toBeNull()
    expect(p.migrantsPerGeneration).toBe(0)
  })

  it('passes the engine\'s domain errors through (Ne below ½)', () => {
    expect(() => projectSubpopulation({ effectiveSize: 0.3, generationTimeYears: 3, horizonYears: 50, migrationRate: 0, diploidLethalEquivalents: 12 }))
      .toThrow(/effectiveSize must be a finite number ≥ 0.5, got 0.3/)
  })

  it('properties: gene flow never raises F, F never falls and fitness never rises over time', () => {
    fc.assert(fc.property(
      fc.double({ min: 0.5, max: 5000, noNaN: true }),
      fc.double({ min: 0.5, max: 20, noNaN: true }),
      fc.double({ min: 0, max: 1, noNaN: true }),
      fc.double({ min: 0, max: 30, noNaN: true }),
      (effectiveSize, generationTimeYears, migrationRate, diploidLethalEquivalents) => {
        const p = projectSubpopulation({ effectiveSize, generationTimeYears, horizonYears: 50, migrationRate, diploidLethalEquivalents })
        p.isolated.forEach((point, i) => {
          if (p.withGeneFlow) expect(p.withGeneFlow[i]!.inbreeding).toBeLessThanOrEqual(point.inbreeding + 1e-15)
          const previous = p.isolated[i - 1]
          if (previous) {
            expect(point.inbreeding).toBeGreaterThanOrEqual(previous.inbreeding)
            expect(point.fitness).toBeLessThanOrEqual(previous.fitness)
          }
          expect(point.inbreeding).toBeGreaterThanOrEqual(0)
          expect(point.inbreeding).toBeLessThanOrEqual(1)
        })
      },
    ), { numRuns: 200, seed: 20260 })
  })
})

describe('migrationRateFromEntry and projectionPointAt', () => {
  it('turns effective migrants into m = migrants / Ne, and checks both entries', () => {
    expect(migrationRateFromEntry({ kind: 'migrants', value: 1 }, 50)).toEqual({ ok: true, rate: 0.02 })
    expect(migrationRateFromEntry({ kind: 'migrants', value: 0 }, 50)).toEqual({ ok: true, rate: 0 })
    expect(migrationRateFromEntry({ kind: 'rate', value: 0.1 }, 50)).toEqual({ ok: true, rate: 0.1 })
    expect(migrationRateFromEntry({ kind: 'migrants', value: 80 }, 50)).toMatchObject({ ok: false, message: expect.stringMatching(/more effective migrants \(80\) than the working Ne \(50\)/i) })
    expect(migrationRateFromEntry({ kind: 'rate', value: 1.5 }, 50)).toMatchObject({ ok: false, message: expect.stringMatching(/between 0 and 1/) })
    expect(migrationRateFromEntry({ kind: 'rate', value: -0.1 }, 50)).toMatchObject({ ok: false })
    expect(migrationRateFromEntry({ kind: 'migrants', value: Number.NaN }, 50)).toMatchObject({ ok: false })
  })

  it('finds the last point at or before a time in years', () => {
    const p = projectSubpopulation({ effectiveSize: 50, generationTimeYears: 3, horizonYears: 50, migrationRate: 0, diploidLethalEquivalents: 12 })
    expect(projectionPointAt(p.isolated, 10)?.generation).toBe(3)
    expect(projectionPointAt(p.isolated, 9)?.generation).toBe(3)
    expect(projectionPointAt(p.isolated, 50)?.years).toBe(48)
    expect(projectionPointAt([], 10)).toBeUndefined()
  })
})
