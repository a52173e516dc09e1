/**
 * Labelled approximations beside the diffusion (Haldane's 2hs with the Ne/N
 * factor, the branching-process survival value), the method warnings and the
 * caution data.
 */
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  branchingSurvivalProbability,
  fixationMethodWarnings,
  fixationProbability,
  haldaneApproximation,
} from '../../../shared/genetics/fixation'
import { CAUTIONS, cautionsFor, FIXATION_PROBABILITY_CAUTIONS, FIXATION_TIME_CAUTIONS } from '../../../shared/genetics/cautions'
import type { CautionId } from '../../../shared/genetics/cautions'
import approximationValues from '../../fixtures/genetics/fixation-approximation-check-values.json'
import branchingValues from '../../fixtures/genetics/fixation-branching.json'
import rulesOfThumb from '../../fixtures/genetics/fixation-rules-of-thumb.json'

/** The SCIENCE.md §1.6 grid. */
function scienceGrid(): { census: number, effectiveSize: number, s: number, h: number, copies: number }[] {
  const grid = []
  for (const census of [10, 50, 100, 1000, 10000]) {
    for (const ratio of [1, 0.5, 0.1]) {
      for (const s of [-0.01, 0.001, 0.01, 0.1, 0.5]) {
        for (const h of [0, 0.25, 0.5, 1]) {
          for (const copies of [1, 5, 20]) {
            if (copies <= 2 * census) grid.push({ census, effectiveSize: census * ratio, s, h, copies })
          }
        }
      }
    }
  }
  return grid
}

describe('haldaneApproximation', () => {
  for (const row of approximationValues.haldaneTable) {
    it(`§1.3 table: N=${row.census} Ne=${row.effectiveSize} s=${row.s} h=${row.h}: 2hs·Ne/N = ${row.twoHsNeOverN}, exact ${row.exact}`, () => {
      const approximation = haldaneApproximation(row)
      expect(approximation.kind).toBe('approximation')
      expect(approximation.linear).toBeCloseTo(row.twoHsNeOverN, 15)
      expect(Math.abs(fixationProbability({ ...row, copies: 1 }) - row.exact)).toBeLessThanOrEqual(row.exactTolerance)
    })
  }

  it('gives the saturating form 1 − exp(−2hs·Ne·k/N)', () => {
    const approximation = haldaneApproximation({ census: 1000, effectiveSize: 500, s: 0.02, h: 0.5, copies: 3 })
    expect(approximation.linear).toBeCloseTo(0.03, 15)
    expect(approximation.saturating).toBeCloseTo(-Math.expm1(-0.03), 15)
  })

  it('reproduces the §1.3 validity claims on the grid (single copies)', () => {
    const claims = approximationValues.validityRuleOnGrid
    let worst = Infinity
    let worstCase: unknown
    for (const inputs of scienceGrid()) {
      if (inputs.copies !== 1) continue
      const approximation = haldaneApproximation(inputs)
      if (!approximation.withinValidity) continue
      const ratio = approximation.linear / fixationProbability(inputs)
      expect(Math.abs(ratio - 1)).toBeLessThanOrEqual(claims.overallBand)
      if (inputs.h === 0.5) expect(Math.abs(ratio - 1)).toBeLessThanOrEqual(claims.additiveBand)
      if (4 * inputs.effectiveSize * inputs.h * inputs.s >= 40) expect(Math.abs(ratio - 1)).toBeLessThanOrEqual(claims.strongBand)
      if (ratio < worst) {
        worst = ratio
        worstCase = inputs
      }
    }
    expect(Math.abs(worst - claims.worstRatio)).toBeLessThanOrEqual(claims.worstRatioTolerance)
    expect(worstCase).toEqual(claims.worstCase)
  })

  it('keeps the saturating form within the same ±14% band for 5 and 20 copies', () => {
    for (const inputs of scienceGrid()) {
      const approximation = haldaneApproximation(inputs)
      if (!approximation.withinValidity) continue
      const ratio = approximation.saturating / fixationProbability(inputs)
      expect(Math.abs(ratio - 1)).toBeLessThanOrEqual(approximationValues.validityRuleOnGrid.overallBand)
    }
  })

  it('flags the rule of thumb as out of validity for recessive, strong or drift-dominated cases', () => {
    expect(haldaneApproximation({ census: 10000, effectiveSize: 10000, s: 0.01, h: 0 }).withinValidity).toBe(false)
    expect(haldaneApproximation({ census: 10000, effectiveSize: 10000, s: 0.1, h: 0.5 }).withinValidity).toBe(false)
    expect(haldaneApproximation({ census: 100, effectiveSize: 100, s: 0.01, h: 0.25 }).withinValidity).toBe(false)
    expect(haldaneApproximation({ census: 1000, effectiveSize: 1000, s: 0.01, h: 0.5 }).withinValidity).toBe(true)
  })

  for (const row of rulesOfThumb.establishment) {
    it(`rule of thumb: ${row.rule}`, () => {
      const u = fixationProbability(row)
      expect(Math.abs(u / row.expected - 1)).toBeLessThanOrEqual(row.relativeTolerance)
      expect(haldaneApproximation(row).linear).toBeCloseTo(row.expected, 15)
    })
  }

  it('reproduces the recessive approximation check of §1.2', () => {
    const row = approximationValues.recessiveApproximation
    const approximation = Math.sqrt((2 * row.effectiveSize * row.s) / Math.PI) / row.census
    expect(Math.abs(approximation - row.approximation)).toBeLessThanOrEqual(row.approximationTolerance)
    expect(Math.abs(fixationProbability(row) - row.exact)).toBeLessThanOrEqual(row.exactTolerance)
  })

  it('validates its inputs', () => {
    expect(() => haldaneApproximation({ census: 10, effectiveSize: 10, s: 0.1, h: 0.5, copies: 0 }))
      .toThrow('haldaneApproximation: copies must be an integer ≥ 1, got 0')
    expect(() => haldaneApproximation({ census: 10, effectiveSize: 10, s: -1.5, h: 0.5 }))
      .toThrow('haldaneApproximation: s must be such that 1 + s > 0 (AA fitness positive), got -1.5')
  })
})

describe('branchingSurvivalProbability', () => {
  for (const row of branchingValues.cases) {
    it(`${row.where}: h·s = ${row.heterozygoteAdvantage} → ${row.expected}`, () => {
      const tolerance: { absolute?: number, relative?: number } = row.tolerance
      const allowed = tolerance.absolute ?? (tolerance.relative ?? 0) * row.expected
      for (const inputs of [{ s: row.heterozygoteAdvantage, h: 1 }, { s: 2 * row.heterozygoteAdvantage, h: 0.5 }]) {
        expect(Math.abs(branchingSurvivalProbability(inputs) - row.expected)).toBeLessThanOrEqual(allowed)
      }
    })
  }

  it('solves 1 − π = exp(−(1 + hs)·π) to rounding, over many orders of magnitude', () => {
    fc.assert(fc.property(fc.double({ min: -12, max: 4, noNaN: true }), (exponent) => {
      const advantage = 10 ** exponent
      const survival = branchingSurvivalProbability({ s: advantage, h: 1 })
      expect(survival).toBeGreaterThan(0)
      expect(survival).toBeLessThanOrEqual(1)
      // Residual relative to π (both sides ≈ 1 − π, so compare with −expm1).
      const residual = Math.abs(survival + Math.expm1(-(1 + advantage) * survival))
      expect(residual).toBeLessThanOrEqual(1e-15 * survival)
    }), { numRuns: 1000 })
  })

  it('approaches 2hs for small hs and increases with hs', () => {
    // π = 2hs − (8/3)(hs)² + …, so π/(2hs) − 1 ≈ −(4/3)·hs
    expect(branchingSurvivalProbability({ s: 1e-8, h: 0.5 }) / 1e-8).toBeCloseTo(1, 7)
    expect(branchingSurvivalProbability({ s: 1e-3, h: 0.5 }) / 1e-3 - 1).toBeCloseTo(-(4 / 3) * 5e-4, 6)
    fc.assert(fc.property(fc.double({ min: 1e-9, max: 100, noNaN: true }), fc.double({ min: 1e-9, max: 100, noNaN: true }), (first, second) => {
      const low = Math.min(first, second)
      const high = Math.max(first, second)
      expect(branchingSurvivalProbability({ s: high, h: 1 })).toBeGreaterThanOrEqual(branchingSurvivalProbability({ s: low, h: 1 }))
    }))
  })

  it('is 0 when the heterozygote is not favoured, and checks its domain', () => {
    expect(branchingSurvivalProbability({ s: -0.1, h: 0.5 })).toBe(0)
    expect(branchingSurvivalProbability({ s: 0.1, h: 0 })).toBe(0)
    expect(() => branchingSurvivalProbability({ s: -1, h: 0.5 }))
      .toThrow('branchingSurvivalProbability: s must be such that 1 + s > 0 (AA fitness positive), got -1')
    expect(() => branchingSurvivalProbability({ s: 0.5, h: -3 }))
      .toThrow('branchingSurvivalProbability: h must be such that 1 + h·s > 0 (Aa fitness positive; s = 0.5), got -3')
  })
})

describe('fixationMethodWarnings', () => {
  const cases: [Parameters<typeof fixationMethodWarnings>[0], CautionId[]][] = [
    [{ census: 100, effectiveSize: 100, s: 0.01, h: 0.5 }, []],
    [{ census: 5, effectiveSize: 5, s: 0.5, h: 1 }, ['very-small-effective-size', 'strong-selection', 'exact-chain-preferred']],
    [{ census: 1000, effectiveSize: 1000, s: 0.0001, h: 1.5 }, ['effectively-neutral', 'under-or-overdominance']],
    [{ census: 1000, effectiveSize: 1000, s: -0.01, h: 0.5 }, ['deleterious-relative-error']],
    [{ census: 100, effectiveSize: 100, s: -0.01, h: 0.5 }, []],
    [{ census: 10, effectiveSize: 25, s: 0.1, h: -0.2 }, ['effective-size-above-twice-census', 'strong-selection', 'under-or-overdominance']],
    [{ census: 1000, effectiveSize: 1000, s: 0.5, h: 0.5 }, ['strong-selection']],
    [{ census: 100, effectiveSize: 9, s: 0.01, h: 0.5 }, ['very-small-effective-size', 'effectively-neutral']],
  ]
  for (const [inputs, expected] of cases) {
    it(`N=${inputs.census} Ne=${inputs.effectiveSize} s=${inputs.s} h=${inputs.h} → [${expected.join(', ')}]`, () => {
      expect(fixationMethodWarnings(inputs)).toEqual(expected)
    })
  }

  it('flags every case where the diffusion is more than 5% above the exact chain (§2.3: all have s = 0.5, or s = −0.01 at N = 1000)', () => {
    for (const [census, s] of [[5, 0.5], [10, 0.5], [100, 0.5], [1000, 0.5], [1000, -0.01]] as const) {
      expect(fixationMethodWarnings({ census, effectiveSize: census, s, h: 1 }).length).toBeGreaterThan(0)
    }
  })

  it('only returns ids that have caution text', () => {
    fc.assert(fc.property(
      fc.integer({ min: 1, max: 100000 }), fc.double({ min: 0.01, max: 1e6, noNaN: true }),
      fc.double({ min: -0.99, max: 2, noNaN: true }), fc.double({ min: -0.4, max: 1.4, noNaN: true }),
      (census, effectiveSize, s, h) => {
        if (!(1 + h * s > 0)) return
        for (const id of fixationMethodWarnings({ census, effectiveSize, s, h })) expect(CAUTIONS[id].text.length).toBeGreaterThan(0)
      },
    ))
  })

  it('validates its inputs', () => {
    expect(() => fixationMethodWarnings({ census: 0, effectiveSize: 10, s: 0.1, h: 0.5 }))
      .toThrow('fixationMethodWarnings: census must be an integer ≥ 1, got 0')
  })
})

describe('caution data', () => {
  it('has an entry for every id, keyed by its own id, with title, plain text and source', () => {
    for (const [key, caution] of Object.entries(CAUTIONS)) {
      expect(caution.id).toBe(key)
      expect(caution.title.length).toBeGreaterThan(3)
      expect(caution.text.length).toBeGreaterThan(20)
      expect(caution.source.length).toBeGreaterThan(3)
    }
  })

  it('lists the standing cautions for probabilities and times', () => {
    expect(cautionsFor(FIXATION_PROBABILITY_CAUTIONS).map(c => c.id)).toEqual([...FIXATION_PROBABILITY_CAUTIONS])
    expect(FIXATION_PROBABILITY_CAUTIONS).toContain('constant-selection')
    expect(FIXATION_PROBABILITY_CAUTIONS).toContain('effective-size-sets-drift')
    expect(FIXATION_PROBABILITY_CAUTIONS).toContain('probability-display')
    expect(FIXATION_TIME_CAUTIONS).toContain('generations-not-years')
  })
})
