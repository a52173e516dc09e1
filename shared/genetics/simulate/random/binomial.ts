import { domainError } from '../../validate'
import type { RandomStream } from './streams'
import { uniform32 } from './uniform'

/** Below this mean (n·min(p, 1−p)) the sampler uses inversion, above it BTRD. */
export const BINOMIAL_INVERSION_LIMIT = 10

/**
 * One draw from Binomial(trials, probability): the number of successes in
 * `trials` independent trials.
 *
 * Why: Wright–Fisher sampling of 2Ne genes, genotypes of translocated animals
 * and multinomial splits all reduce to binomial draws.
 *
 * Method (both exact, no normal approximation): with p* = min(p, 1 − p),
 * - n·p* < 10: sequential inversion from 0 with the pmf recurrence
 *   P(x) = P(x−1)·(n−x+1)p/(x·q), one uniform per draw; the search restarts
 *   beyond mean + 10 sd, which truncates a tail of probability < 10⁻¹⁵;
 * - n·p* ≥ 10: BTRD, transformed rejection with decomposition (Hörmann 1993,
 *   "The generation of binomial random variates", Journal of Statistical
 *   Computation and Simulation 46:101–110), accepting with the exact pmf
 *   ratio (recursion near the mode, a squeeze, then Stirling series with a
 *   table of exact tails for k ≤ 9); constant expected cost, about 1.4
 *   uniforms per draw.
 * Results for p > ½ are n minus a draw at 1 − p. Uniforms have 32 random
 * bits (`uniform32`), so probabilities are reproduced to within 2⁻³².
 *
 * @param random - seeded generator
 * @param trials - n, integer ≥ 0
 * @param probability - p, in [0, 1]
 * @returns an integer in [0, n]
 * @throws RangeError if n is not a non-negative integer or p is outside [0, 1]
 * @example sampleBinomial(replicateStream(1, 0), 10, 0) // 0
 * @example sampleBinomial(replicateStream(1, 0), 10, 1) // 10
 * @example sampleBinomial(replicateStream(1, 0), 2000, 0.3) // ≈ 600 ± 20
 */
export function sampleBinomial(random: RandomStream, trials: number, probability: number): number {
  if (!(trials >= 0) || !Number.isInteger(trials)) domainError('sampleBinomial', 'trials', 'an integer ≥ 0', trials)
  if (!(probability >= 0 && probability <= 1)) domainError('sampleBinomial', 'probability', 'in [0, 1]', probability)
  return binomialDraw(random, trials, probability)
}

/** Number of entries `binomialSetup` writes. */
export const BINOMIAL_SETUP_SIZE = 7

/** Branch codes stored in entry 0 of a setup. */
const INVERSION = 0
const BTRD = 1

const scratchSetup = new Float64Array(BINOMIAL_SETUP_SIZE)

/**
 * `sampleBinomial` without argument checks, for inner loops whose callers
 * guarantee an integer n ≥ 0 and p in [0, 1].
 *
 * @param random - seeded generator
 * @param trials - n, integer ≥ 0 (not checked)
 * @param probability - p in [0, 1] (not checked)
 * @returns an integer in [0, n]
 */
export function binomialDraw(random: RandomStream, trials: number, probability: number): number {
  if (trials === 0 || probability === 0) return 0
  if (probability === 1) return trials
  if (probability <= 0.5) {
    binomialSetup(trials, probability, scratchSetup, 0)
    return binomialWithSetup(random, trials, probability, scratchSetup, 0)
  }
  const complement = 1 - probability
  binomialSetup(trials, complement, scratchSetup, 0)
  return trials - binomialWithSetup(random, trials, complement, scratchSetup, 0)
}

/**
 * The per-(n, p) constants of the sampler for 0 < p ≤ ½, written to
 * out[offset … offset + 6] (the last entry is p itself), so that callers
 * drawing many times from the same (n, p) — e.g. the same allele count in
 * many replicates — can keep them. A draw with a stored setup is
 * bit-for-bit the draw `binomialDraw` makes.
 *
 * The samplers read their constants from this array instead of taking them
 * as arguments: doubles passed to a call that is not inlined are boxed (a
 * heap allocation each), and that garbage once cost a quarter of the
 * allele-frequency simulation's time.
 *
 * @param trials - n, integer ≥ 1
 * @param probability - p in (0, ½]
 * @param out - destination array
 * @param offset - first entry written
 */
export function binomialSetup(trials: number, probability: number, out: Float64Array, offset: number): void {
  const mean = trials * probability
  if (mean < BINOMIAL_INVERSION_LIMIT) {
    out[offset] = INVERSION
    out[offset + 1] = Math.exp(trials * Math.log1p(-probability))
    out[offset + 2] = Math.min(trials, mean + 10 * Math.sqrt(mean * (1 - probability) + 1))
    out[offset + 3] = probability / (1 - probability)
    out[offset + 6] = probability
    return
  }
  const spread = Math.sqrt(mean * (1 - probability))
  const b = 1.15 + 2.53 * spread
  out[offset] = BTRD
  out[offset + 1] = spread
  out[offset + 2] = b
  out[offset + 3] = -0.0873 + 0.0248 * b + 0.01 * probability
  out[offset + 4] = mean + 0.5
  out[offset + 5] = 0.92 - 4.2 / b
  out[offset + 6] = probability
}

/**
 * One Binomial(n, p) draw for 0 < p ≤ ½ from constants made by
 * `binomialSetup(n, p, setup, offset)`.
 *
 * @param random - seeded generator
 * @param trials - n
 * @param probability - p in (0, ½] (the same p as stored in the setup, which is what is used)
 * @param setup - array holding the constants
 * @param offset - where they start
 * @returns an integer in [0, n]
 */
export function binomialWithSetup(random: RandomStream, trials: number, probability: number, setup: Float64Array, offset: number): number {
  return setup[offset] === INVERSION ? binomialInversion(random, trials, setup, offset) : binomialBtrdWithSetup(random, trials, setup, offset)
}

/**
 * The pmf values P(0), P(1), … up to the inversion bound of a setup made by
 * `binomialSetup` for n·p < 10 (empty for the BTRD branch), computed with
 * the same recurrence and rounding as the sampler, so that
 * `binomialInversionFromTable` draws exactly what `binomialWithSetup` draws.
 *
 * @param trials - n
 * @param setup - array holding the constants
 * @param offset - where they start
 * @returns a new array of at most ⌊bound⌋ + 1 probabilities
 */
export function binomialInversionTable(trials: number, setup: Float64Array, offset: number): Float64Array {
  if (setup[offset] !== INVERSION) return new Float64Array(0)
  const bound = setup[offset + 2] as number // entries exist by contract
  const odds = setup[offset + 3] as number
  const table = new Float64Array(Math.floor(bound) + 1)
  let pmf = setup[offset + 1] as number
  table[0] = pmf
  for (let successes = 1; successes < table.length; successes++) {
    pmf *= (trials - successes + 1) * odds / successes
    table[successes] = pmf
  }
  return table
}

/**
 * Inversion draw from a pmf table made by `binomialInversionTable` (restarts
 * past the bound like `binomialWithSetup`, with identical results).
 *
 * @param random - seeded generator
 * @param table - P(0), P(1), … up to the bound
 * @returns an integer in [0, table.length − 1]
 */
export function binomialInversionFromTable(random: RandomStream, table: Float64Array): number {
  const bound = table.length - 1
  let successes = 0
  let remaining = uniform32(random)
  // successes ≤ bound inside the loop, hence the `as number` reads.
  while (remaining > (table[successes] as number)) {
    successes++
    if (successes > bound) {
      successes = 0
      remaining = uniform32(random)
    } else {
      remaining -= table[successes - 1] as number
    }
  }
  return successes
}

/** Inversion for p ≤ ½ and n·p < 10 (see `sampleBinomial`), constants from a setup. */
function binomialInversion(random: RandomStream, trials: number, setup: Float64Array, offset: number): number {
  // The entries exist by contract, hence the `as number` reads.
  const probabilityOfZero = setup[offset + 1] as number
  const bound = setup[offset + 2] as number
  const odds = setup[offset + 3] as number
  let successes = 0
  let pmf = probabilityOfZero
  let remaining = uniform32(random)
  while (remaining > pmf) {
    successes++
    if (successes > bound) {
      successes = 0
      pmf = probabilityOfZero
      remaining = uniform32(random)
    } else {
      remaining -= pmf
      pmf *= (trials - successes + 1) * odds / successes
    }
  }
  return successes
}

/**
 * ln k! − [½ln(2π) + (k + ½)ln(k + 1) − (k + 1)] for k = 0…9, as BTRD needs
 * (Hörmann 1993); values from an independent mpmath computation (30 digits),
 * rounded to the nearest double.
 */
const STIRLING_TAIL = [
  0.08106146679532726, 0.0413406959554093, 0.02767792568499834, 0.020790672103765093,
  0.016644691189821193, 0.013876128823070748, 0.01189670994589177, 0.010411265261972096,
  0.009255462182712733, 0.00833056343336287,
]

/** Tail of Stirling's series for ln k!, in the form BTRD needs (see table above). */
function stirlingTail(k: number): number {
  if (k <= 9) return STIRLING_TAIL[k] as number // 0 ≤ k ≤ 9 here
  const next = k + 1
  const square = next * next
  return (1 / 12 - (1 / 360 - 1 / 1260 / square) / square) / next
}

/** Largest |k − mode| for which BTRD accepts by the exact pmf ratio (step 3.1). */
const RATIO_REACH = 15

/** Layout of a BTRD acceptance table (`binomialBtrdAcceptanceTable`). */
const ACCEPT_ODDS = 0
const ACCEPT_ALPHA = 1
const ACCEPT_MODE = 2
const ACCEPT_PREFIX = 3
/** f(k)/f(mode) for k = mode − 15 … mode + 15 starts here. */
const ACCEPT_RATIOS = 4

/** Number of entries of a BTRD acceptance table. */
export const BTRD_ACCEPTANCE_SIZE = ACCEPT_RATIOS + 2 * RATIO_REACH + 1

/**
 * f(k)/f(m) for BTRD step 3.1 by the pmf recurrence f(i)/f(i − 1) = (n + 1 − i)·r/i,
 * multiplied (k > m) or divided (k < m) in increasing i. The one place this
 * ratio is computed, so cached tables and direct draws agree to the bit.
 */
function btrdRatio(trials: number, odds: number, mode: number, k: number): number {
  const step = (trials + 1) * odds
  let ratio = 1
  if (mode < k) {
    for (let i = mode + 1; i <= k; i++) ratio *= step / i - odds
  } else if (mode > k) {
    for (let i = k + 1; i <= mode; i++) ratio /= step / i - odds
  }
  return ratio
}

/**
 * The k-independent start of BTRD's exact log ratio (step 3.4), in the
 * order the full sum adds its terms.
 */
function btrdLogPrefix(trials: number, odds: number, mode: number): number {
  return (mode + 0.5) * Math.log((mode + 1) / (odds * (trials - mode + 1)))
    + stirlingTail(mode) + stirlingTail(trials - mode)
}

/**
 * What BTRD's acceptance steps compute from (n, p) alone, for a setup made
 * by `binomialSetup` in the BTRD branch: r = p/(1 − p), α, the mode m, the
 * k-independent part of the exact log ratio, and the exact pmf ratios
 * f(k)/f(m) for |k − m| ≤ 15 (NaN outside 0…n). Callers that draw many times
 * from one (n, p) keep it; `binomialBtrdWithSetup` then skips the
 * recurrence and most logarithms, with bit-for-bit the same draws.
 *
 * @param trials - n
 * @param setup - array holding the BTRD constants
 * @param offset - where they start
 * @returns a new array of BTRD_ACCEPTANCE_SIZE entries
 */
export function binomialBtrdAcceptanceTable(trials: number, setup: Float64Array, offset: number): Float64Array {
  // The entries exist by contract, hence the `as number` reads.
  const spread = setup[offset + 1] as number
  const b = setup[offset + 2] as number
  const probability = setup[offset + 6] as number
  const odds = probability / (1 - probability)
  const mode = Math.floor((trials + 1) * probability)
  const table = new Float64Array(BTRD_ACCEPTANCE_SIZE)
  table[ACCEPT_ODDS] = odds
  table[ACCEPT_ALPHA] = (2.83 + 5.1 / b) * spread
  table[ACCEPT_MODE] = mode
  table[ACCEPT_PREFIX] = btrdLogPrefix(trials, odds, mode)
  for (let j = 0; j <= 2 * RATIO_REACH; j++) {
    const k = mode - RATIO_REACH + j
    table[ACCEPT_RATIOS + j] = k < 0 || k > trials ? Number.NaN : btrdRatio(trials, odds, mode, k)
  }
  return table
}

/**
 * BTRD for p ≤ ½ and n·p ≥ 10: transformed rejection with decomposition
 * (Hörmann 1993), steps 1–3.4 of the paper, with the constants of a setup
 * made by `binomialSetup` for the BTRD branch. Step 1 accepts about 86 % of
 * the box region with a single uniform; otherwise a second uniform completes
 * the (u, v) pair and the candidate is accepted by, in turn, the exact pmf
 * ratio by recursion when |k − m| ≤ 15, a squeeze on its logarithm, and the
 * exact log ratio written with Stirling tails. One function, so that no
 * double crosses a call (see `binomialSetup`).
 *
 * @param random - seeded generator
 * @param trials - n
 * @param setup - array holding the BTRD constants
 * @param offset - where they start
 * @param acceptance - optional `binomialBtrdAcceptanceTable` of the same setup
 *   (same draws, fewer operations when a candidate needs the acceptance steps)
 * @returns an integer in [0, n]
 */
export function binomialBtrdWithSetup(random: RandomStream, trials: number, setup: Float64Array, offset: number, acceptance?: Float64Array): number {
  firstUniformSlot[0] = uniform32(random)
  return binomialBtrdFromUniform(random, trials, setup, offset, acceptance)
}

/**
 * Where a caller puts the first uniform before calling `binomialBtrdFromUniform`.
 * A double passed as an argument to a call that is not inlined is boxed (see
 * `binomialSetup`); going through this array instead made the cached drift
 * step about 12 % faster (paired runs, bench/simulate.bench.ts model). Read at
 * once on entry, so nothing else can write it in between (one array per thread).
 */
export const firstUniformSlot = new Float64Array(1)

/**
 * `binomialBtrdWithSetup` with its first uniform already drawn (by a caller
 * that tried BTRD step 1 itself and found v outside the quick box): the
 * same steps on the same uniforms, so the draw is bit-for-bit the one
 * `binomialBtrdWithSetup` makes from the stream positioned before that
 * uniform.
 *
 * The first uniform v (`uniform32(random)`, already drawn) is read from
 * `firstUniformSlot[0]`, where the caller has just written it.
 *
 * @param random - seeded generator (positioned after that first uniform)
 * @param trials - n
 * @param setup - array holding the BTRD constants
 * @param offset - where they start
 * @param acceptance - optional `binomialBtrdAcceptanceTable` of the same setup
 * @returns an integer in [0, n]
 */
export function binomialBtrdFromUniform(random: RandomStream, trials: number, setup: Float64Array, offset: number, acceptance: Float64Array | undefined): number {
  const firstUniform = firstUniformSlot[0] as number
  // The entries exist by contract, hence the `as number` reads.
  const spread = setup[offset + 1] as number
  const b = setup[offset + 2] as number
  const a = setup[offset + 3] as number
  const c = setup[offset + 4] as number
  const boxLimit = setup[offset + 5] as number
  const probability = setup[offset + 6] as number
  const quickLimit = 0.86 * boxLimit
  // Every rejection (`continue`) starts the next attempt with a fresh v.
  for (let v = firstUniform; ; v = uniform32(random)) {
    let u: number
    if (v <= quickLimit) {
      // Step 1: inside the box; u is uniform on [−0.43, 0.43].
      u = v / boxLimit - 0.43
      return Math.floor((2 * a / (0.5 - Math.abs(u)) + b) * u + c)
    }
    if (v >= boxLimit) {
      // Step 2, upper part: v is uniform on [v_r, 1]; draw u afresh.
      u = uniform32(random) - 0.5
    } else {
      // Step 2, side strips: reuse v for u with 0.43 < |u| ≤ 0.5, draw v on [0, v_r].
      u = v / boxLimit - 0.93
      u = (u < 0 ? -0.5 : 0.5) - u
      v = uniform32(random) * boxLimit
    }
    const us = 0.5 - Math.abs(u)
    const k = Math.floor((2 * a / us + b) * u + c)
    if (k < 0 || k > trials) continue

    // Steps 3.0–3.4: is the candidate k accepted for this (u, v)?
    const odds = acceptance ? acceptance[ACCEPT_ODDS] as number : probability / (1 - probability)
    const alpha = acceptance ? acceptance[ACCEPT_ALPHA] as number : (2.83 + 5.1 / b) * spread
    const mode = acceptance ? acceptance[ACCEPT_MODE] as number : Math.floor((trials + 1) * probability)
    const scaled = v * alpha / (a / (us * us) + b)
    const distance = Math.abs(k - mode)
    if (distance <= RATIO_REACH) {
      // Step 3.1: the exact ratio f(k)/f(m).
      const ratio = acceptance ? acceptance[ACCEPT_RATIOS + k - mode + RATIO_REACH] as number : btrdRatio(trials, odds, mode, k)
      if (scaled <= ratio) return k
      continue
    }
    // Step 3.2: squeeze on ln f(k)/f(m) (as in BTPE).
    const logV = Math.log(scaled)
    const variance = spread * spread
    const rho = (distance / variance) * ((distance * (distance / 3 + 0.625) + 1 / 6) / variance + 0.5)
    const t = -distance * distance / (2 * variance)
    if (logV < t - rho) return k
    if (logV > t + rho) continue
    // Steps 3.3–3.4: the exact log ratio.
    const bound = (acceptance ? acceptance[ACCEPT_PREFIX] as number : btrdLogPrefix(trials, odds, mode))
      + (trials + 1) * Math.log((trials - mode + 1) / (trials - k + 1))
      + (k + 0.5) * Math.log(odds * (trials - k + 1) / (k + 1))
      - stirlingTail(k) - stirlingTail(trials - k)
    if (logV <= bound) return k
  }
}
