/**
 * Drift, inbreeding and migration (shared/genetics/drift): reference values
 * from fixture files, edge cases and domain errors. Property tests live in
 * drift-properties.test.ts.
 */
import { describe, expect, it } from 'vitest'
import {
  equilibriumInbreeding,
  equilibriumInbreedingApproximation,
  generationsFromYears,
  generationsToReachInbreeding,
  heterozygosityHalfLife,
  heterozygosityRetained,
  heterozygosityRetainedVaryingSize,
  inbreedingAfter,
  inbreedingRatePerYear,
  inbreedingTrajectory,
  MAXIMUM_TRAJECTORY_GENERATIONS,
  migrantsForEquilibriumInbreeding,
  migrantsPerGeneration,
  migrationRateForEquilibriumInbreeding,
  ONE_MIGRANT_PER_GENERATION_RULE,
  yearsFromGenerations,
} from '../../../shared/genetics/drift'
import scienceValues from '../../fixtures/genetics/drift-science-check-values.json'
import referenceGrid from '../../fixtures/genetics/drift-reference-grid.json'
import rulesOfThumb from '../../fixtures/genetics/drift-rules-of-thumb.json'

interface Tolerance { relative?: number, absolute?: number }
interface FixtureCase { function: string, input: Record<string, unknown>, expected: number | number[], tolerance: Tolerance, where?: string }

// Fixture inputs are plain JSON objects; each entry passes them to one engine function.
type Call = (input: never) => number | number[]
const functions: Record<string, Call> = {
  heterozygosityRetained,
  heterozygosityRetainedVaryingSize,
  heterozygosityHalfLife,
  inbreedingAfter,
  inbreedingTrajectory,
  equilibriumInbreeding,
  equilibriumInbreedingApproximation,
  migrantsPerGeneration,
  migrantsForEquilibriumInbreeding,
  migrationRateForEquilibriumInbreeding,
  generationsToReachInbreeding,
  generationsFromYears,
  yearsFromGenerations,
  inbreedingRatePerYear,
}

function expectClose(actual: number, expected: number, tolerance: Tolerance, label: string): void {
  const allowed = Math.max(tolerance.absolute ?? 0, (tolerance.relative ?? 0) * Math.abs(expected))
  const error = Math.abs(actual - expected)
  expect(error <= allowed, `${label}: got ${actual}, expected ${expected} ± ${allowed} (error ${error})`).toBe(true)
}

function runCase(testCase: FixtureCase): void {
  const call = functions[testCase.function]
  if (!call) throw new Error(`fixture names an unknown function ${testCase.function}`)
  const actual = call(testCase.input as never)
  const label = `${testCase.function}(${JSON.stringify(testCase.input)})${testCase.where ? ` [${testCase.where}]` : ''}`
  if (Array.isArray(testCase.expected)) {
    expect(Array.isArray(actual), label).toBe(true)
    const values = actual as number[]
    expect(values.length, label).toBe(testCase.expected.length)
    testCase.expected.forEach((expected, index) => expectClose(values[index] ?? Number.NaN, expected, testCase.tolerance, `${label}[${index}]`))
  } else {
    expectClose(actual as number, testCase.expected, testCase.tolerance, label)
  }
}

describe('drift: SCIENCE.md check values (§4.1, §4.2, §6.2, §6.4, §10, §11 rows 32–36, 44)', () => {
  it('has a source and cases', () => {
    expect(scienceValues.source).toMatch(/SCIENCE\.md/)
    expect(scienceValues.cases.length).toBeGreaterThan(80)
  })
  it.each(scienceValues.cases.map(c => [`${c.function} ${JSON.stringify(c.input)} — ${c.where}`, c] as const))('%s', (_name, testCase) => {
    runCase(testCase as FixtureCase)
  })
})

describe('drift: independent mpmath reference grid', () => {
  it('has a source', () => {
    expect(referenceGrid.source).toMatch(/mpmath/)
  })
  const byFunction = new Map<string, FixtureCase[]>()
  for (const testCase of referenceGrid.cases as FixtureCase[]) {
    const list = byFunction.get(testCase.function) ?? []
    list.push(testCase)
    byFunction.set(testCase.function, list)
  }
  for (const [name, cases] of byFunction) {
    it(`${name}: ${cases.length} cases within (k + |exponent|)·eps`, () => {
      for (const testCase of cases) runCase(testCase)
    })
  }
})

describe('drift: rules of thumb (common practice, no source; bounds from Mills & Allendorf 1996)', () => {
  const { oneMigrant, oneMigrantExact, halfLife, perYearRate } = rulesOfThumb
  it('has a source', () => expect(rulesOfThumb.source).toMatch(/common practice, no source/))
  it('one effective migrant per generation gives approximate equilibrium F = 0.2', () => {
    // Ne·m = 1 for several Ne: the approximation depends on Ne·m only.
    for (const effectiveSize of [10, 50, 400]) {
      const migrationRate = oneMigrant.effectiveMigrants / effectiveSize
      expectClose(equilibriumInbreedingApproximation({ effectiveSize, migrationRate }), oneMigrant.approximateEquilibrium, { absolute: oneMigrant.toleranceAbsolute }, `Ne=${effectiveSize}`)
      expectClose(migrantsPerGeneration({ effectiveSize, migrationRate }), 1, { relative: 2 ** -51 }, `Ne·m, Ne=${effectiveSize}`)
    }
    expect(ONE_MIGRANT_PER_GENERATION_RULE.equilibriumInbreedingAtMinimum).toBe(oneMigrant.approximateEquilibrium)
  })
  it('the exact equilibrium at one migrant lies just below 0.2', () => {
    for (const effectiveSize of oneMigrantExact.effectiveSizes) {
      const value = equilibriumInbreeding({ effectiveSize, migrationRate: oneMigrantExact.effectiveMigrants / effectiveSize })
      expect(value).toBeGreaterThan(oneMigrantExact.exactEquilibriumLow)
      expect(value).toBeLessThan(oneMigrantExact.exactEquilibriumHigh)
    }
  })
  it('half-life of heterozygosity ≈ 1.386·Ne', () => {
    for (const effectiveSize of halfLife.effectiveSizes) {
      expectClose(heterozygosityHalfLife({ effectiveSize }), halfLife.factor * effectiveSize, { relative: halfLife.relativeTolerance }, `Ne=${effectiveSize}`)
    }
  })
  it('per-year inbreeding rate ≈ 1/(2·Ne·L)', () => {
    for (const [effectiveSize = Number.NaN, generationTime = Number.NaN] of perYearRate.cases) {
      expectClose(inbreedingRatePerYear({ effectiveSize, generationTime }), 1 / (2 * effectiveSize * generationTime), { relative: perYearRate.relativeTolerance }, `Ne=${effectiveSize}, L=${generationTime}`)
    }
  })
})

describe('drift: edge cases', () => {
  it('returns the start value at t = 0, even at the domain edges', () => {
    expect(heterozygosityRetained({ effectiveSize: 0.5, generations: 0 })).toBe(1)
    expect(inbreedingAfter({ effectiveSize: 0.5, generations: 0, initialInbreeding: 0.3 })).toBe(0.3)
    expect(inbreedingAfter({ effectiveSize: 50, generations: 0, initialInbreeding: 0.3, migrationRate: 1 })).toBe(0.3)
    expect(inbreedingTrajectory({ effectiveSize: 50, generations: 0, initialInbreeding: 0.1 })).toEqual([0.1])
  })
  it('Ne = ½ inbreeds completely in one generation', () => {
    expect(heterozygosityRetained({ effectiveSize: 0.5, generations: 1 })).toBe(0)
    expect(inbreedingAfter({ effectiveSize: 0.5, generations: 1 })).toBe(1)
    expect(heterozygosityHalfLife({ effectiveSize: 0.5 })).toBe(0)
    expect(inbreedingRatePerYear({ effectiveSize: 0.5, generationTime: 4 })).toBe(1)
  })
  it('complete replacement by immigrants (m = 1) resets F to 0 after one generation', () => {
    expect(inbreedingAfter({ effectiveSize: 50, generations: 3, initialInbreeding: 0.9, migrationRate: 1 })).toBe(0)
    expect(equilibriumInbreeding({ effectiveSize: 50, migrationRate: 1 })).toBe(0)
  })
  it('isolation (m = 0) has equilibrium F = 1 and needs no migrants for a target of 1', () => {
    expect(equilibriumInbreeding({ effectiveSize: 50, migrationRate: 0 })).toBe(1)
    expect(equilibriumInbreedingApproximation({ effectiveSize: 50, migrationRate: 0 })).toBe(1)
    expect(migrantsForEquilibriumInbreeding({ targetInbreeding: 1 })).toBe(0)
    expect(migrationRateForEquilibriumInbreeding({ effectiveSize: 50, targetInbreeding: 1 })).toBe(0)
  })
  it('F_0 = 1 stays 1 without migrants', () => {
    expect(inbreedingAfter({ effectiveSize: 30, generations: 12.5, initialInbreeding: 1 })).toBe(1)
  })
  it('keeps relative precision for very large Ne (no 1 − tiny cancellation)', () => {
    // F_1 = 1/(2Ne) exactly in real arithmetic; 1e-12 relative shows log1p/expm1 are used.
    expectClose(inbreedingAfter({ effectiveSize: 1e12, generations: 1 }), 5e-13, { relative: 1e-12 }, 'Ne = 1e12')
    expectClose(1 - heterozygosityRetained({ effectiveSize: 1e9, generations: 1 }), 5e-10, { relative: 1e-6 }, 'H, Ne = 1e9')
    expectClose(equilibriumInbreeding({ effectiveSize: 1e9, migrationRate: 1e-12 }), 1 / (4e-3 + 1), { relative: 1e-9 }, 'F̂, Ne = 1e9, m = 1e-12')
  })
  it('accepts real-valued generations without migration (years / L)', () => {
    const generations = generationsFromYears({ years: 25, generationTime: 4 })
    expect(generations).toBe(6.25)
    expectClose(inbreedingAfter({ effectiveSize: 40, generations }), 1 - (1 - 1 / 80) ** 6.25, { relative: 1e-14 }, 't = 6.25')
  })
  it('a threshold already reached takes 0 generations', () => {
    expect(generationsToReachInbreeding({ effectiveSize: 50, targetInbreeding: 0.2, initialInbreeding: 0.2 })).toBe(0)
  })
  it('varying sizes: empty list retains everything, constant sizes match the constant formula', () => {
    expect(heterozygosityRetainedVaryingSize({ effectiveSizes: [] })).toBe(1)
    expectClose(
      heterozygosityRetainedVaryingSize({ effectiveSizes: Array.from({ length: 10 }, () => 50) }),
      heterozygosityRetained({ effectiveSize: 50, generations: 10 }),
      { relative: 32 * 2 ** -52 },
      'ten generations at Ne = 50',
    )
  })
  it('does not mutate its inputs', () => {
    const sizes = Object.freeze([10, 20, 30])
    expect(() => heterozygosityRetainedVaryingSize({ effectiveSizes: sizes })).not.toThrow()
  })
})

describe('drift: domain errors use the standard RangeError message', () => {
  const cases: [string, () => unknown, string][] = [
    ['Ne below ½', () => heterozygosityRetained({ effectiveSize: 0.4, generations: 1 }), 'heterozygosityRetained: effectiveSize must be a finite number ≥ 0.5, got 0.4'],
    ['negative t', () => heterozygosityRetained({ effectiveSize: 10, generations: -1 }), 'heterozygosityRetained: generations must be a finite number ≥ 0, got -1'],
    ['NaN Ne', () => inbreedingAfter({ effectiveSize: Number.NaN, generations: 1 }), 'inbreedingAfter: effectiveSize must be a finite number ≥ 0.5, got NaN'],
    ['infinite Ne', () => inbreedingAfter({ effectiveSize: Number.POSITIVE_INFINITY, generations: 1 }), 'inbreedingAfter: effectiveSize must be a finite number ≥ 0.5, got Infinity'],
    ['F_0 above 1', () => inbreedingAfter({ effectiveSize: 10, generations: 1, initialInbreeding: 1.5 }), 'inbreedingAfter: initialInbreeding must be in [0, 1], got 1.5'],
    ['negative m', () => inbreedingAfter({ effectiveSize: 10, generations: 1, migrationRate: -0.1 }), 'inbreedingAfter: migrationRate must be in [0, 1], got -0.1'],
    ['fractional t with m > 0', () => inbreedingAfter({ effectiveSize: 10, generations: 2.5, migrationRate: 0.1 }), 'inbreedingAfter: generations must be a whole number when migrationRate > 0, got 2.5'],
    ['fractional trajectory', () => inbreedingTrajectory({ effectiveSize: 10, generations: 2.5 }), `inbreedingTrajectory: generations must be an integer in [0, ${MAXIMUM_TRAJECTORY_GENERATIONS}], got 2.5`],
    ['huge trajectory', () => inbreedingTrajectory({ effectiveSize: 10, generations: MAXIMUM_TRAJECTORY_GENERATIONS + 1 }), `inbreedingTrajectory: generations must be an integer in [0, ${MAXIMUM_TRAJECTORY_GENERATIONS}], got ${MAXIMUM_TRAJECTORY_GENERATIONS + 1}`],
    ['m above 1', () => equilibriumInbreeding({ effectiveSize: 10, migrationRate: 2 }), 'equilibriumInbreeding: migrationRate must be in [0, 1], got 2'],
    ['approximation Ne', () => equilibriumInbreedingApproximation({ effectiveSize: 0, migrationRate: 0.1 }), 'equilibriumInbreedingApproximation: effectiveSize must be a finite number ≥ 0.5, got 0'],
    ['migrants m', () => migrantsPerGeneration({ effectiveSize: 10, migrationRate: 1.1 }), 'migrantsPerGeneration: migrationRate must be in [0, 1], got 1.1'],
    ['target 0', () => migrantsForEquilibriumInbreeding({ targetInbreeding: 0 }), 'migrantsForEquilibriumInbreeding: targetInbreeding must be in (0, 1], got 0'],
    ['exact target 0', () => migrationRateForEquilibriumInbreeding({ effectiveSize: 10, targetInbreeding: 0 }), 'migrationRateForEquilibriumInbreeding: targetInbreeding must be in (0, 1], got 0'],
    ['half-life Ne', () => heterozygosityHalfLife({ effectiveSize: 0.25 }), 'heterozygosityHalfLife: effectiveSize must be a finite number ≥ 0.5, got 0.25'],
    ['threshold below start', () => generationsToReachInbreeding({ effectiveSize: 10, targetInbreeding: 0.1, initialInbreeding: 0.2 }), 'generationsToReachInbreeding: targetInbreeding must be in [initialInbreeding, 1) = [0.2, 1), got 0.1'],
    ['threshold of 1', () => generationsToReachInbreeding({ effectiveSize: 10, targetInbreeding: 1 }), 'generationsToReachInbreeding: targetInbreeding must be in [initialInbreeding, 1) = [0, 1), got 1'],
    ['start of 1', () => generationsToReachInbreeding({ effectiveSize: 10, targetInbreeding: 0.5, initialInbreeding: 1 }), 'generationsToReachInbreeding: initialInbreeding must be in [0, 1), got 1'],
    ['L = 0', () => generationsFromYears({ years: 10, generationTime: 0 }), 'generationsFromYears: generationTime must be a finite number > 0, got 0'],
    ['negative years', () => generationsFromYears({ years: -1, generationTime: 2 }), 'generationsFromYears: years must be a finite number ≥ 0, got -1'],
    ['negative generations', () => yearsFromGenerations({ generations: -1, generationTime: 2 }), 'yearsFromGenerations: generations must be a finite number ≥ 0, got -1'],
    ['per-year L', () => inbreedingRatePerYear({ effectiveSize: 10, generationTime: -2 }), 'inbreedingRatePerYear: generationTime must be a finite number > 0, got -2'],
    ['varying sizes entry', () => heterozygosityRetainedVaryingSize({ effectiveSizes: [10, 0.1] }), 'heterozygosityRetainedVaryingSize: effectiveSizes[i] must be a finite number ≥ 0.5, got 0.1'],
  ]
  it.each(cases)('%s', (_name, call, message) => {
    expect(call).toThrow(RangeError)
    expect(call).toThrow(message)
  })
})
