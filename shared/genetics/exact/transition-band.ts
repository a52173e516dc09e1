import { binomialRowExtent, fillBinomialRow } from './binomial-row'
import { selectedOdds } from './selection-step'

/**
 * Truncation of the binomial rows (relative to each row's largest term).
 *
 * Below the mode (towards fewer copies) terms under 10⁻²⁰ are dropped. This
 * is safe by monotonicity: the selection map p → p′ is increasing for positive
 * fitnesses, so the chain is stochastically monotone and u_j ≤ u_i for j < i.
 * Dropping a mass m below state i (it stays on the diagonal, because each
 * pivot is the sum of the kept off-diagonal terms) perturbs the equation of
 * state i by at most m·u_i, and summed over the visits before absorption the
 * relative error of u_i is at most m·t̄₁(i) (t̄₁ = mean time to fixation given
 * fixation, ≤ ~4N): < 10⁻¹⁴ for 2N ≤ 10⁴.
 *
 * Above the mode (towards more copies) terms under 10⁻³⁰⁰ are dropped; u_j
 * for those j can be far larger than u_i (for a strongly deleterious allele
 * u_j/u_i reaches 10¹⁰⁰ and more), so this side keeps everything a double can
 * usefully hold: the dropped mass is < 10⁻²⁹⁸ per row. A first pass with
 * 10⁻⁴⁰ is tried when the allele is not strongly deleterious and kept only if
 * an a-posteriori bound proves it harmless (chain-solution.ts).
 * The unit tests show that more conservative cutoffs change no result, and
 * that over-aggressive ones (10⁻⁵ below, 10⁻²⁰ above) do.
 */
export const LOWER_TAIL_CUTOFF = 1e-20
export const UPPER_TAIL_CUTOFF = 1e-300

/**
 * A cheaper upper cutoff tried first when the allele is not strongly
 * deleterious (see chain-solution.ts). Its result is kept only if the
 * a-posteriori bound on the error it causes is negligible; otherwise the
 * chain is rebuilt with UPPER_TAIL_CUTOFF.
 */
export const FAST_UPPER_TAIL_CUTOFF = 1e-40

/**
 * Every stored probability is multiplied by 2⁵¹² (the reduction is
 * homogeneous, so the factor cancels): tail terms of 10⁻³⁰⁰ times elimination
 * multipliers of 10⁻²⁰ then stay far from the subnormal range. Unscaled,
 * about 0.1% of the updates (measured at census 1000, s = −0.1) would produce
 * subnormal numbers, each taking the processor's slow path (of the order of a
 * hundred cycles on x86).
 */
export const STORAGE_SCALE = 2 ** 512

/**
 * The transient block of the chain (states 1..n−1) in profile storage: row i
 * keeps columns lowColumn[i]..highColumn[i] at entries[rowStart[i] + j −
 * lowColumn[i]]. lowColumn and highColumn are non-decreasing in i, so
 * eliminating states in increasing order creates fill only inside the profile.
 * The absorbing columns are kept apart: toLoss[i] = P(i → 0), toFixation[i] =
 * P(i → n), all scaled by STORAGE_SCALE. droppedAbove[i] bounds the
 * probability cut from row i above its mode (same scale).
 */
export interface TransitionBand {
  geneCopies: number
  rowStart: Int32Array
  lowColumn: Int32Array
  highColumn: Int32Array
  entries: Float64Array
  toLoss: Float64Array
  toFixation: Float64Array
  droppedAbove: Float64Array
}

/**
 * Builds the truncated transition matrix of the Wright–Fisher chain with
 * selection (SCIENCE.md §2.1–2.2) for n = 2N gene copies.
 * Cost O(n·width) time and memory; with the full cutoffs a row at frequency
 * x keeps ≈ (√(2·ln 10³⁰⁰) + √(2·ln 10²⁰))·√(n·x(1−x)) ≈ 47·√(n·x(1−x))
 * columns (normal approximation; 1115 on average at 2N = 4000).
 */
export function buildTransitionBand(
  geneCopies: number, s: number, h: number,
  lowerCutoff = LOWER_TAIL_CUTOFF, upperCutoff = UPPER_TAIL_CUTOFF,
): TransitionBand {
  const n = geneCopies
  const lowColumn = new Int32Array(n + 1)
  const highColumn = new Int32Array(n + 1)
  const rawLow = new Int32Array(n + 1)
  const rawHigh = new Int32Array(n + 1)
  // Pass 1: where each row is cut.
  for (let i = 1; i < n; i++) {
    const { numerator, denominator } = selectedOdds(i, n, s, h)
    const extent = binomialRowExtent(n, numerator, denominator, lowerCutoff, upperCutoff)
    rawLow[i] = extent.low
    rawHigh[i] = extent.high
  }
  // Monotone envelope clipped to the transient columns 1..n−1.
  let runningLow = n - 1
  for (let i = n - 1; i >= 1; i--) {
    runningLow = Math.min(runningLow, Math.max(1, rawLow[i] ?? 1))
    lowColumn[i] = runningLow
  }
  let runningHigh = 1
  for (let i = 1; i < n; i++) {
    runningHigh = Math.max(runningHigh, Math.min(n - 1, rawHigh[i] ?? 1))
    highColumn[i] = runningHigh
  }
  const rowStart = new Int32Array(n + 1)
  let total = 0
  for (let i = 1; i < n; i++) {
    rowStart[i] = total
    total += (highColumn[i] ?? 0) - (lowColumn[i] ?? 0) + 1
  }
  rowStart[n] = total
  const entries = new Float64Array(total)
  const toLoss = new Float64Array(n + 1)
  const toFixation = new Float64Array(n + 1)
  const droppedAbove = new Float64Array(n + 1)
  const scratch = new Float64Array(n + 1)
  // Pass 2: the probabilities themselves.
  for (let i = 1; i < n; i++) {
    const { numerator, denominator } = selectedOdds(i, n, s, h)
    const extent = binomialRowExtent(n, numerator, denominator, lowerCutoff, upperCutoff)
    droppedAbove[i] = fillBinomialRow(n, numerator, denominator, extent, scratch, STORAGE_SCALE).above
    const base = (rowStart[i] ?? 0) - (lowColumn[i] ?? 0)
    for (let j = extent.low; j <= extent.high; j++) {
      const probability = scratch[j] ?? 0
      if (j === 0) toLoss[i] = probability
      else if (j === n) toFixation[i] = probability
      else entries[base + j] = probability
    }
  }
  return { geneCopies: n, rowStart, lowColumn, highColumn, entries, toLoss, toFixation, droppedAbove }
}
