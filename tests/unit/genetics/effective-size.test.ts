/**
 * Effective size from demography (shared/genetics/effective-size): SCIENCE.md
 * check values, an independent exact/mpmath reference grid, cited data,
 * cautions, domain errors and property tests.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { inbreedingAfter } from '../../../shared/genetics/drift'
import {
  effectiveSizeCautions,
  effectiveSizeForInbreedingTarget,
  effectiveSizeFromFamilyVariance,
  effectiveSizeFromRatio,
  effectiveSizeFromSexFamilyVariance,
  effectiveSizeFromSexRatio,
  effectiveSizeHarmonicMean,
  MINIMUM_EFFECTIVE_SIZE_RULES,
  NE_TO_CENSUS_RATIO_DEFAULT,
  SHORT_TERM_RULE_GENERATIONS,
} from '../../../shared/genetics/effective-size'
import scienceValues from '../../fixtures/genetics/effective-size-science-check-values.json'
import referenceGrid from '../../fixtures/genetics/effective-size-reference-grid.json'
import published from '../../fixtures/genetics/load-published-magnitudes.json'

const EPS = 2 ** -52

interface Tolerance { relative?: number, absolute?: number }
interface FixtureCase { function: string, input: Record<string, unknown>, expected: number, tolerance: Tolerance, where?: string }

type Call = (input: never) => number
const functions: Record<string, Call> = {
  effectiveSizeFromSexRatio,
  effectiveSizeHarmonicMean: ((input: { sizes: number[] }) => effectiveSizeHarmonicMean(input.sizes)) as Call,
  effectiveSizeFromFamilyVariance,
  effectiveSizeFromSexFamilyVariance,
  effectiveSizeForInbreedingTarget,
  effectiveSizeFromRatio,
}

function expectClose(actual: number, expected: number, tolerance: Tolerance, label: string): void {
  const allowed = Math.max(tolerance.absolute ?? 0, (tolerance.relative ?? 0) * Math.abs(expected))
  const error = Math.abs(actual - expected)
  expect(error <= allowed, `${label}: got ${actual}, expected ${expected} ± ${allowed} (error ${error})`).toBe(true)
}

function runCase(testCase: FixtureCase): void {
  const call = functions[testCase.function]
  if (!call) throw new Error(`fixture names an unknown function ${testCase.function}`)
  expectClose(call(testCase.input as never), testCase.expected, testCase.tolerance, `${testCase.function}(${JSON.stringify(testCase.input)})${testCase.where ? ` [${testCase.where}]` : ''}`)
}

describe('effective size: SCIENCE.md check values (§5, §6.4, §11 rows 37–39, 45)', () => {
  it('has a source', () => expect(scienceValues.source).toMatch(/SCIENCE\.md/))
  it.each(scienceValues.cases.map(c => [`${c.function} ${JSON.stringify(c.input)} — ${c.where}`, c] as const))('%s', (_name, testCase) => {
    runCase(testCase as FixtureCase)
  })
  it('rows 37 and 39 are exact in double precision', () => {
    expect(effectiveSizeFromSexRatio({ males: 10, females: 40 })).toBe(32)
    expect(effectiveSizeFromFamilyVariance({ census: 50, familySizeVariance: 6 })).toBe(24.75)
  })
})

describe('effective size: independent reference grid (exact rationals, mpmath)', () => {
  it('has a source', () => expect(referenceGrid.source).toMatch(/fractions|mpmath/))
  it.each(referenceGrid.cases.map(c => [`${c.function} ${JSON.stringify(c.input)}`, c] as const))('%s', (_name, testCase) => {
    runCase(testCase as FixtureCase)
  })
})

describe('effective size: cited data', () => {
  it('Ne/N default is Frankham (1995)\'s comprehensive average 0.10–0.11, with a wider user range', () => {
    const { comprehensiveRatioLow, comprehensiveRatioHigh } = published.frankham1995
    expect(NE_TO_CENSUS_RATIO_DEFAULT.value).toBeGreaterThanOrEqual(comprehensiveRatioLow)
    expect(NE_TO_CENSUS_RATIO_DEFAULT.value).toBeLessThanOrEqual(comprehensiveRatioHigh)
    expect(NE_TO_CENSUS_RATIO_DEFAULT.low).toBeLessThan(NE_TO_CENSUS_RATIO_DEFAULT.value)
    expect(NE_TO_CENSUS_RATIO_DEFAULT.high).toBeGreaterThan(NE_TO_CENSUS_RATIO_DEFAULT.value)
    expect(NE_TO_CENSUS_RATIO_DEFAULT.source).toMatch(/Frankham R \(1995\)/)
    expect(effectiveSizeFromRatio({ census: 480 })).toBeCloseTo(48, 12)
  })
  it('minimum-Ne rules match Franklin (1980) 50/500 and Frankham et al. (2014) 100/1000', () => {
    expect(MINIMUM_EFFECTIVE_SIZE_RULES.original.shortTermEffectiveSize).toBe(published.franklin1980.shortTerm)
    expect(MINIMUM_EFFECTIVE_SIZE_RULES.original.longTermEffectiveSize).toBe(published.franklin1980.longTerm)
    expect(MINIMUM_EFFECTIVE_SIZE_RULES.original.evidence).toBe('memory')
    expect(MINIMUM_EFFECTIVE_SIZE_RULES.revised.shortTermEffectiveSize).toBe(published.frankham2014.shortTerm)
    expect(MINIMUM_EFFECTIVE_SIZE_RULES.revised.longTermEffectiveSize).toBe(published.frankham2014.longTerm)
    expect(MINIMUM_EFFECTIVE_SIZE_RULES.revised.evidence).toBe('paper')
    expect(SHORT_TERM_RULE_GENERATIONS).toBe(published.frankham2014.generations)
  })
  it('the revised short-term rule is the Ne that holds F at its five-generation value (SCIENCE.md §6.4: F* = 0.0248 → 99.80)', () => {
    const f5 = inbreedingAfter({ effectiveSize: MINIMUM_EFFECTIVE_SIZE_RULES.revised.shortTermEffectiveSize, generations: SHORT_TERM_RULE_GENERATIONS })
    expectClose(effectiveSizeForInbreedingTarget({ maxInbreeding: f5, generations: SHORT_TERM_RULE_GENERATIONS }), 100, { relative: 1e-12 }, 'round trip at Ne = 100')
  })
})

describe('effective size: cautions (SCIENCE.md §5, §10; thresholds are common practice, no source)', () => {
  it('flags very small Ne and Ne above twice the census', () => {
    expect(effectiveSizeCautions({ effectiveSize: 50, census: 200 })).toEqual([])
    expect(effectiveSizeCautions({ effectiveSize: 10 })).toEqual([])
    expect(effectiveSizeCautions({ effectiveSize: 9.99 }).map(c => c.code)).toEqual(['very-small'])
    expect(effectiveSizeCautions({ effectiveSize: 80, census: 40 })).toEqual([])
    expect(effectiveSizeCautions({ effectiveSize: 80.5, census: 40 }).map(c => c.code)).toEqual(['above-twice-census'])
    expect(effectiveSizeCautions({ effectiveSize: 5, census: 2 }).map(c => c.code)).toEqual(['very-small', 'above-twice-census'])
  })
  it('family-size variance below 2 can push Ne towards 2N, which stays below the caution threshold', () => {
    const ne = effectiveSizeFromFamilyVariance({ census: 40, familySizeVariance: 0 })
    expect(ne).toBe(79)
    expect(effectiveSizeCautions({ effectiveSize: ne, census: 40 })).toEqual([])
  })
})

describe('effective size: domain errors use the standard RangeError message', () => {
  const cases: [string, () => unknown, string][] = [
    ['no males', () => effectiveSizeFromSexRatio({ males: 0, females: 10 }), 'effectiveSizeFromSexRatio: males must be a finite number > 0, got 0'],
    ['NaN females', () => effectiveSizeFromSexRatio({ males: 3, females: Number.NaN }), 'effectiveSizeFromSexRatio: females must be a finite number > 0, got NaN'],
    ['empty sizes', () => effectiveSizeHarmonicMean([]), 'effectiveSizeHarmonicMean: sizes must be a non-empty array of numbers, got []'],
    ['zero size', () => effectiveSizeHarmonicMean([10, 0]), 'effectiveSizeHarmonicMean: sizes[i] must be a finite number > 0, got 0'],
    ['census below 1', () => effectiveSizeFromFamilyVariance({ census: 0.5, familySizeVariance: 2 }), 'effectiveSizeFromFamilyVariance: census must be a finite number ≥ 1, got 0.5'],
    ['negative Vk', () => effectiveSizeFromFamilyVariance({ census: 10, familySizeVariance: -1 }), 'effectiveSizeFromFamilyVariance: familySizeVariance must be a finite number ≥ 0, got -1'],
    ['negative male Vk', () => effectiveSizeFromSexFamilyVariance({ census: 10, maleFamilySizeVariance: -1, femaleFamilySizeVariance: 2 }), 'effectiveSizeFromSexFamilyVariance: maleFamilySizeVariance must be a finite number ≥ 0, got -1'],
    ['target 0', () => effectiveSizeForInbreedingTarget({ maxInbreeding: 0, generations: 5 }), 'effectiveSizeForInbreedingTarget: maxInbreeding must be in (0, 1), got 0'],
    ['target 1', () => effectiveSizeForInbreedingTarget({ maxInbreeding: 1, generations: 5 }), 'effectiveSizeForInbreedingTarget: maxInbreeding must be in (0, 1), got 1'],
    ['zero horizon', () => effectiveSizeForInbreedingTarget({ maxInbreeding: 0.1, generations: 0 }), 'effectiveSizeForInbreedingTarget: generations must be a finite number > 0, got 0'],
    ['zero ratio', () => effectiveSizeFromRatio({ census: 100, ratio: 0 }), 'effectiveSizeFromRatio: ratio must be a finite number > 0, got 0'],
    ['caution census', () => effectiveSizeCautions({ effectiveSize: 10, census: -3 }), 'effectiveSizeCautions: census must be a finite number > 0, got -3'],
  ]
  it.each(cases)('%s', (_name, call, message) => {
    expect(call).toThrow(RangeError)
    expect(call).toThrow(message)
  })
})

describe('effective size: properties', () => {
  const count = fc.double({ min: 1e-3, max: 1e7, noNaN: true })
  it('harmonic mean ≤ arithmetic mean, and lies within [min, max]', () => {
    fc.assert(fc.property(fc.array(count, { minLength: 1, maxLength: 30 }), (sizes) => {
      const harmonic = effectiveSizeHarmonicMean(sizes)
      const arithmetic = sizes.reduce((sum, size) => sum + size, 0) / sizes.length
      const slack = 4 * sizes.length * EPS
      expect(harmonic).toBeLessThanOrEqual(arithmetic * (1 + slack))
      expect(harmonic).toBeGreaterThanOrEqual(Math.min(...sizes) * (1 - slack))
      expect(harmonic).toBeLessThanOrEqual(Math.max(...sizes) * (1 + slack))
    }))
  })
  it('harmonic mean of equal sizes is that size', () => {
    fc.assert(fc.property(count, fc.integer({ min: 1, max: 50 }), (size, n) => {
      expectClose(effectiveSizeHarmonicMean(Array.from({ length: n }, () => size)), size, { relative: 2 * n * EPS }, `${n} × ${size}`)
    }))
  })
  it('sex-ratio Ne ≤ Nm + Nf, with equality at 1:1', () => {
    fc.assert(fc.property(count, count, (males, females) => {
      const total = males + females
      expect(effectiveSizeFromSexRatio({ males, females })).toBeLessThanOrEqual(total * (1 + 4 * EPS))
      expectClose(effectiveSizeFromSexRatio({ males, females: males }), 2 * males, { relative: 4 * EPS }, `1:1 at ${males}`)
    }))
  })
  it('sex-ratio Ne is symmetric in the sexes', () => {
    fc.assert(fc.property(count, count, (males, females) => {
      expect(effectiveSizeFromSexRatio({ males, females })).toBe(effectiveSizeFromSexRatio({ males: females, females: males }))
    }))
  })
  it('family-variance Ne falls as Vk rises; the two-sex form agrees when both sexes share Vk', () => {
    fc.assert(fc.property(fc.double({ min: 1, max: 1e5, noNaN: true }), fc.double({ min: 0, max: 100, noNaN: true }), fc.double({ min: 0, max: 100, noNaN: true }), (census, a, b) => {
      const [low, high] = a <= b ? [a, b] : [b, a]
      expect(effectiveSizeFromFamilyVariance({ census, familySizeVariance: high })).toBeLessThanOrEqual(effectiveSizeFromFamilyVariance({ census, familySizeVariance: low }))
      expectClose(
        effectiveSizeFromSexFamilyVariance({ census, maleFamilySizeVariance: a, femaleFamilySizeVariance: a }),
        effectiveSizeFromFamilyVariance({ census, familySizeVariance: a }),
        { relative: 8 * EPS },
        `N=${census}, Vk=${a}`,
      )
    }))
  })
  it('effectiveSizeForInbreedingTarget round-trips through inbreedingAfter and is the smallest such Ne', () => {
    fc.assert(fc.property(fc.double({ min: 1e-6, max: 0.99, noNaN: true }), fc.double({ min: 0.5, max: 1e4, noNaN: true }), (maxInbreeding, generations) => {
      const size = effectiveSizeForInbreedingTarget({ maxInbreeding, generations })
      expect(size).toBeGreaterThanOrEqual(0.5)
      const reached = inbreedingAfter({ effectiveSize: size, generations })
      expect(Math.abs(reached - maxInbreeding)).toBeLessThanOrEqual(1e-12 * maxInbreeding)
      // A slightly smaller population overshoots the target; a larger one stays below it.
      fc.pre(size * (1 - 1e-9) >= 0.5)
      expect(inbreedingAfter({ effectiveSize: size * (1 - 1e-9), generations })).toBeGreaterThan(maxInbreeding)
      expect(inbreedingAfter({ effectiveSize: size * (1 + 1e-9), generations })).toBeLessThan(maxInbreeding)
    }))
  })
  it('effectiveSizeForInbreedingTarget grows with the horizon and with a stricter target', () => {
    fc.assert(fc.property(fc.double({ min: 1e-4, max: 0.9, noNaN: true }), fc.double({ min: 0.5, max: 1000, noNaN: true }), fc.double({ min: 0.5, max: 1000, noNaN: true }), (target, a, b) => {
      const [short, long] = a <= b ? [a, b] : [b, a]
      expect(effectiveSizeForInbreedingTarget({ maxInbreeding: target, generations: long }))
        .toBeGreaterThanOrEqual(effectiveSizeForInbreedingTarget({ maxInbreeding: target, generations: short }) * (1 - 8 * EPS))
      expect(effectiveSizeForInbreedingTarget({ maxInbreeding: target / 2, generations: short }))
        .toBeGreaterThan(effectiveSizeForInbreedingTarget({ maxInbreeding: target, generations: short }))
    }))
  })
})
