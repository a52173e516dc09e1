/**
 * The exact chain truncates each binomial row below 10⁻²⁰ (towards fewer
 * copies) and 10⁻³⁰⁰ (towards more) of its largest term
 * (shared/genetics/exact/transition-band.ts). These tests show the cutoffs
 * cost no accuracy: (1) the dropped mass per row is below the documented
 * bounds, and (2) solving with far more conservative cutoffs (10⁻⁶⁰ / 10⁻³⁰⁵)
 * changes no fixation probability or time by more than rounding, including
 * probabilities of 10⁻⁹³, 10⁻¹¹⁸ and 10⁻²⁸⁵. (The independent float128 reference in
 * exact-chain-references.test.ts keeps every term and agrees too.)
 */
import { describe, expect, it } from 'vitest'
import { exactFixationProbabilities } from '../../../shared/genetics/exact'
import { binomialRowExtent, fillBinomialRow } from '../../../shared/genetics/exact/binomial-row'
import {
  factoriseAndSolve, FAST_PASS_TOLERANCE, upperTruncationBound,
} from '../../../shared/genetics/exact/chain-solution'
import { selectedOdds } from '../../../shared/genetics/exact/selection-step'
import { reduceStates, solveReduced } from '../../../shared/genetics/exact/state-reduction'
import {
  buildTransitionBand, FAST_UPPER_TAIL_CUTOFF, LOWER_TAIL_CUTOFF, STORAGE_SCALE, UPPER_TAIL_CUTOFF,
} from '../../../shared/genetics/exact/transition-band'

function solveWith(census: number, s: number, h: number, lower: number, upper: number) {
  const n = 2 * census
  const band = buildTransitionBand(n, s, h, lower, upper)
  const pivot = reduceStates(band)
  const u = solveReduced(band, pivot, new Float64Array(n + 1), 1)
  const reward = new Float64Array(n + 1)
  for (let i = 1; i < n; i++) reward[i] = (u[i] ?? 0) * STORAGE_SCALE
  const w = solveReduced(band, pivot, reward, 0)
  return { u, w, stored: band.entries.length }
}

describe('row truncation', () => {
  it('drops < 10⁻¹⁹ below and < 10⁻²⁹⁸ above the mode in every row at 2N = 4000', () => {
    const n = 4000
    for (const [s, h] of [[0, 0.5], [0.5, 1], [-0.5, 0], [0.02, -0.5]] as const) {
      let worstLower = 0
      let worstUpper = 0
      const scratch = new Float64Array(n + 1)
      for (let i = 1; i < n; i++) {
        const { numerator, denominator } = selectedOdds(i, n, s, h)
        const extent = binomialRowExtent(n, numerator, denominator, LOWER_TAIL_CUTOFF, UPPER_TAIL_CUTOFF)
        const { below, above } = fillBinomialRow(n, numerator, denominator, extent, scratch, 1)
        worstLower = Math.max(worstLower, below)
        worstUpper = Math.max(worstUpper, above)
        let kept = 0
        for (let j = extent.low; j <= extent.high; j++) kept += scratch[j] ?? 0
        expect(Math.abs(kept - 1)).toBeLessThan(1e-14)
      }
      expect(worstLower, `s=${s} h=${h}`).toBeLessThan(1e-19)
      expect(worstUpper, `s=${s} h=${h}`).toBeLessThan(1e-298)
    }
  })

  it.each([
    [200, 0.1, 0.5],
    [200, -0.05, 1],
    [1000, -0.1, 0.5],
    [1000, -0.28, 0.5],
    [300, 0.02, -0.5],
    [200, -0.5, 0.5],
  ])('census %i, s = %f, h = %f: conservative cutoffs change nothing', (census, s, h) => {
    const standard = solveWith(census, s, h, LOWER_TAIL_CUTOFF, UPPER_TAIL_CUTOFF)
    const conservative = solveWith(census, s, h, 1e-60, 1e-305)
    expect(conservative.stored).toBeGreaterThan(standard.stored)
    let worstU = 0
    let worstTime = 0
    for (let k = 1; k < 2 * census; k++) {
      const u = standard.u[k] ?? 0
      const reference = conservative.u[k] ?? 0
      expect(reference).toBeGreaterThan(1e-300)
      worstU = Math.max(worstU, Math.abs(u / reference - 1))
      const time = (standard.w[k] ?? 0) / u
      const referenceTime = (conservative.w[k] ?? 0) / reference
      worstTime = Math.max(worstTime, Math.abs(time / referenceTime - 1))
    }
    expect(worstU).toBeLessThan(1e-12)
    expect(worstTime).toBeLessThan(1e-11)
  }, 60_000)

  it('over-aggressive cutoffs do show up, on either side (so the comparison above can fail)', () => {
    // Strongly deleterious allele: u_j/u_i is huge for j > i, so the upper
    // tail matters down to ~10⁻⁴⁰ here; 10⁻³⁰⁰ leaves a wide margin.
    const standard = solveWith(200, -0.5, 0.5, LOWER_TAIL_CUTOFF, UPPER_TAIL_CUTOFF)
    const shortUpper = solveWith(200, -0.5, 0.5, LOWER_TAIL_CUTOFF, 1e-20)
    const shortLower = solveWith(200, -0.5, 0.5, 1e-5, UPPER_TAIL_CUTOFF)
    expect(Math.abs((shortUpper.u[1] ?? 0) / (standard.u[1] ?? 1) - 1)).toBeGreaterThan(1e-3)
    expect(Math.abs((shortLower.u[1] ?? 0) / (standard.u[1] ?? 1) - 1)).toBeGreaterThan(1e-6)
  })
})

describe('fast first pass (upper cutoff 10⁻⁴⁰) and its a-posteriori error bound', () => {
  const worstRatio = (bound: Float64Array, u: Float64Array) => {
    let worst = 0
    for (let i = 1; i < u.length - 1; i++) worst = Math.max(worst, (bound[i] ?? 0) / (u[i] ?? 0))
    return worst
  }

  it('the bound really bounds the error where the error is visible', () => {
    const reference = factoriseAndSolve(400, -0.5, 0.5, 1e-305).fixation
    const short = factoriseAndSolve(400, -0.5, 0.5, 1e-20)
    const bound = upperTruncationBound(short)
    let worstActual = 0
    for (let i = 1; i < 400; i++) {
      const actual = Math.abs((reference[i] ?? 0) - (short.fixation[i] ?? 0))
      worstActual = Math.max(worstActual, actual / (reference[i] ?? 1))
      expect(actual, `state ${i}`).toBeLessThanOrEqual((bound[i] ?? 0) * (1 + 1e-9))
    }
    expect(worstActual).toBeGreaterThan(1e-3)
  })

  it.each([
    [200, 0.1, 0.5],
    [1000, 0.01, 0.5],
    [1000, -0.01, 0.5],
    [200, 0.02, -0.5],
  ])('census %i, s = %f, h = %f: accepted (bound ≤ 10⁻²⁰·u) and used by the public function', (census, s, h) => {
    const fast = factoriseAndSolve(2 * census, s, h, FAST_UPPER_TAIL_CUTOFF)
    expect(worstRatio(upperTruncationBound(fast), fast.fixation)).toBeLessThanOrEqual(FAST_PASS_TOLERANCE)
    expect(exactFixationProbabilities({ census, s, h })).toEqual(fast.fixation)
  }, 60_000)

  it.each([
    [40, -0.5, 0.5],
    [20, -0.9, 0.5],
  ])('census %i, s = %f, h = %f: tried, rejected, and the full cutoff used instead', (census, s, h) => {
    const fast = factoriseAndSolve(2 * census, s, h, FAST_UPPER_TAIL_CUTOFF)
    expect(worstRatio(upperTruncationBound(fast), fast.fixation)).toBeGreaterThan(FAST_PASS_TOLERANCE)
    expect(exactFixationProbabilities({ census, s, h })).toEqual(factoriseAndSolve(2 * census, s, h, UPPER_TAIL_CUTOFF).fixation)
  })
})
