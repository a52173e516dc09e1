/**
 * The effective-size estimate contract (shared/schemas/effective-size.ts): the computation the
 * page and the server share, checked against the engine's own check values
 * (tests/fixtures/genetics/effective-size-science-check-values.json: independent mpmath reference
 * computation, SCIENCE.md §5); the POST schema (a posted value is refused, inputs are checked);
 * default sources; the working-Ne schema; the method catalogue.
 */
import { describe, expect, it } from 'vitest'
import { EFFECTIVE_SIZE_METHODS } from '../../../shared/types/db'
import {
  computeEffectiveSizeEstimate,
  COMPUTED_EFFECTIVE_SIZE_METHODS,
  defaultEstimateSource,
  EFFECTIVE_SIZE_METHOD_INFO,
  EffectiveSizeCreateSchema,
  effectiveSizeMethodLabel,
  WorkingNeSchema,
  type EffectiveSizeComputation,
} from '../../../shared/schemas/effective-size'
import science from '../../fixtures/genetics/effective-size-science-check-values.json'

interface FixtureCase { function: string, input: Record<string, unknown>, expected: number, tolerance: { absolute?: number, relative?: number } }
const cases = science.cases as FixtureCase[]

const asComputation: Record<string, (input: Record<string, unknown>) => EffectiveSizeComputation> = {
  effectiveSizeFromSexRatio: input => ({ method: 'sex-ratio', inputs: input as { males: number, females: number } }),
  effectiveSizeHarmonicMean: (input) => {
    const sizes = input.sizes as number[]
    return { method: 'harmonic-mean', inputs: { years: sizes.map((_, i) => 2000 + i), sizes } }
  },
  effectiveSizeFromFamilyVariance: input => ({ method: 'family-size-variance', inputs: input as { census: number, familySizeVariance: number } }),
  effectiveSizeFromRatio: input => ({ method: 'ne-n-ratio', inputs: { census: input.census as number, ratio: 0.1, ratioLow: 0.05, ratioHigh: 0.3 } }),
}

describe('computeEffectiveSizeEstimate', () => {
  const covered = cases.filter(entry => entry.function in asComputation)

  it(`matches ${covered.length} engine check values (${science.source.slice(0, 48)}…)`, () => {
    expect(covered.length).toBeGreaterThanOrEqual(15)
    for (const entry of covered) {
      const { value } = computeEffectiveSizeEstimate(asComputation[entry.function]!(entry.input))
      const allowed = entry.tolerance.absolute ?? (entry.tolerance.relative ?? 0) * Math.abs(entry.expected)
      expect(Math.abs(value - entry.expected), `${entry.function} ${JSON.stringify(entry.input)}`).toBeLessThanOrEqual(allowed)
    }
  })

  it('gives the Ne/N range as an interval and no interval for the other methods', () => {
    expect(computeEffectiveSizeEstimate({ method: 'ne-n-ratio', inputs: { census: 500, ratio: 0.1, ratioLow: 0.05, ratioHigh: 0.3 } }))
      .toEqual({ value: 50, intervalLow: 25, intervalHigh: 150 })
    expect(computeEffectiveSizeEstimate({ method: 'sex-ratio', inputs: { males: 10, females: 40 } })).toEqual({ value: 32, intervalLow: null, intervalHigh: null })
  })

  it('passes the engine\'s domain errors through (a census of 0 adults in a harmonic mean)', () => {
    expect(() => computeEffectiveSizeEstimate({ method: 'harmonic-mean', inputs: { years: [2020, 2021], sizes: [10, 0] } }))
      .toThrow(RangeError)
  })
})

describe('EffectiveSizeCreateSchema', () => {
  const issues = (input: unknown) => {
    const result = EffectiveSizeCreateSchema.safeParse(input)
    return result.success ? [] : result.error.issues.map(issue => ({ path: issue.path.join('.'), code: issue.code, message: issue.message }))
  }

  it('accepts each computed method with its inputs', () => {
    expect(issues({ method: 'sex-ratio', inputs: { males: 10.5, females: 40, year: 2024 } })).toEqual([])
    expect(issues({ method: 'harmonic-mean', inputs: { years: [2020, 2021] } })).toEqual([])
    expect(issues({ method: 'family-size-variance', inputs: { census: 20, familySizeVariance: 0 }, source: 'Nest checks', estimatedOn: '2025-02-28' })).toEqual([])
    expect(issues({ method: 'ne-n-ratio', inputs: { census: 200, ratio: 0.1, ratioLow: 0.1, ratioHigh: 0.1 } })).toEqual([])
  })

  it('refuses a value (or any unknown field) at the top level and inside the inputs', () => {
    expect(issues({ method: 'sex-ratio', inputs: { males: 10, females: 40 }, value: 32 })).toEqual([{ path: '', code: 'unrecognized_keys', message: expect.any(String) }])
    expect(issues({ method: 'sex-ratio', inputs: { males: 10, females: 40, value: 32 } })[0]).toMatchObject({ path: 'inputs', code: 'unrecognized_keys' })
    expect(issues({ method: 'ne-n-ratio', inputs: { census: 200, ratio: 0.1, ratioLow: 0.05, ratioHigh: 0.3 }, intervalHigh: 999 })[0]?.code).toBe('unrecognized_keys')
  })

  it('checks inputs: positive numbers, years once, a ratio inside its range, real dates, known methods', () => {
    expect(issues({ method: 'sex-ratio', inputs: { males: 0, females: 4 } })).toEqual([{ path: 'inputs.males', code: 'too_small', message: 'Breeding males must be greater than 0.' }])
    expect(issues({ method: 'harmonic-mean', inputs: { years: [2020] } })[0]?.message).toBe('Choose at least two census years.')
    expect(issues({ method: 'harmonic-mean', inputs: { years: [2020, 2020] } })[0]?.message).toBe('Each year may be chosen once.')
    expect(issues({ method: 'family-size-variance', inputs: { census: 0.9, familySizeVariance: 2 } })[0]?.message).toBe('Breeding adults must be at least 1.')
    expect(issues({ method: 'ne-n-ratio', inputs: { census: 200, ratio: 0.1, ratioLow: 0.05, ratioHigh: 0.08 } }))
      .toEqual([{ path: 'inputs.ratioHigh', code: 'custom', message: 'The high end must not be below the ratio.' }])
    expect(issues({ method: 'ne-n-ratio', inputs: { census: 200, ratio: 3, ratioLow: 0.05, ratioHigh: 3 } })[0]?.path).toBe('inputs.ratio')
    expect(issues({ method: 'sex-ratio', inputs: { males: 1, females: 1 }, estimatedOn: '2025-13-01' })[0]?.message).toBe('Enter a real date, like 2025-03-01.')
    expect(issues({ method: 'temporal', inputs: {} })[0]?.message).toMatch(/^Choose a method: sex-ratio, harmonic-mean, family-size-variance, ne-n-ratio\.$/)
  })
})

describe('sources, labels and the working Ne', () => {
  it('writes a default source that says where the inputs come from', () => {
    expect(defaultEstimateSource({ method: 'sex-ratio', inputs: { males: 1, females: 2, year: 2024 } })).toBe('Census 2024: breeding males and females')
    expect(defaultEstimateSource({ method: 'sex-ratio', inputs: { males: 1, females: 2 } })).toBe('Breeding males and females entered in Tributary')
    expect(defaultEstimateSource({ method: 'harmonic-mean', inputs: { years: [2019, 2015, 2024] } })).toBe('Census 2015–2024: adult counts of 3 years')
    expect(defaultEstimateSource({ method: 'ne-n-ratio', inputs: { census: 10, ratio: 0.1, ratioLow: 0.05, ratioHigh: 0.3, censusYear: 2023 } }))
      .toBe('Census 2023; assumed Ne/N 0.1 (range 0.05–0.3)')
  })

  it('has a label, formula and citation for every known method, and names unknown ones as stored', () => {
    for (const method of EFFECTIVE_SIZE_METHODS) {
      const info = EFFECTIVE_SIZE_METHOD_INFO[method]
      expect(info.label.length).toBeGreaterThan(3)
      expect(info.citation.length).toBeGreaterThan(5)
    }
    for (const method of COMPUTED_EFFECTIVE_SIZE_METHODS) expect(EFFECTIVE_SIZE_METHODS).toContain(method)
    expect(effectiveSizeMethodLabel('sex-ratio')).toBe('Sex ratio')
    expect(effectiveSizeMethodLabel('pedigree, 2019 studbook')).toBe('pedigree, 2019 studbook')
  })

  it('WorkingNeSchema needs a reason and a version, and accepts null to clear', () => {
    expect(WorkingNeSchema.safeParse({ value: 48, reason: 'Latest sexed census.', version: 3 }).success).toBe(true)
    expect(WorkingNeSchema.safeParse({ value: null, reason: 'Estimates disagree for now.', version: 3 }).success).toBe(true)
    const missing = WorkingNeSchema.safeParse({ value: 48, version: 3 })
    expect(missing.success ? [] : missing.error.issues.map(issue => issue.path.join('.'))).toEqual(['reason'])
    const tiny = WorkingNeSchema.safeParse({ value: 0.2, reason: 'far too small really', version: 0 })
    expect(tiny.success ? '' : tiny.error.issues[0]?.message).toBe('The working Ne must be at least 0.5.')
    expect(WorkingNeSchema.safeParse({ value: 48, reason: '   short   ', version: 0 }).success).toBe(false)
  })
})
