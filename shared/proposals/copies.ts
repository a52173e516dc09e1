/**
 * How many copies of a variant one release carries, and sums over that number.
 *
 * k animals drawn from a source where the variant has frequency q carry 2k gene copies, each
 * the variant with probability q independently: the number of variant copies J is
 * Binomial(2k, q) (random sampling of animals from a large, randomly mating source —
 * Hardy–Weinberg genotypes, sampling with replacement). Any per-copy-number quantity f(j) is
 * then averaged as E[f(J)] = Σ_j P(J = j)·f(j).
 *
 * The sums run in log space so that probabilities far below 10⁻³⁰⁸ (deleterious variants) keep
 * their size, and they stop once the rest of the sum is provably below 10⁻¹⁶ of what has been
 * added (tail bounds below). Pure; no Vue or server imports.
 */
import { logFactorial } from '../genetics/simulate/random/log-factorial'
import type { CopiesDistribution } from './types'

/** The neglected remainder of a sum is kept below this share of the sum. */
export const MIXTURE_TOLERANCE = 1e-16

/** Copies shown in a distribution are those with P(j) at least this share of the largest P(j). */
const DISPLAY_TOLERANCE = 1e-15

/**
 * ln P(J = j) for J ~ Binomial(n, q).
 *
 * Formula: ln C(n, j) + j·ln q + (n − j)·ln(1 − q), with ln(1 − q) as log1p(−q).
 *
 * @param n - trials (gene copies), integer ≥ 0
 * @param j - successes, integer in [0, n]
 * @param q - success probability, in [0, 1]
 * @returns ln P, ≤ 0; −Infinity where P = 0 (e.g. j < n with q = 1)
 * @example binomialLogProbability(2, 1, 0.5)  // ln 0.5 = −0.6931471805599453
 * @example binomialLogProbability(4, 4, 1)    // 0
 */
export function binomialLogProbability(n: number, j: number, q: number): number {
  const successes = j === 0 ? 0 : q === 0 ? Number.NEGATIVE_INFINITY : j * Math.log(q)
  const failures = j === n ? 0 : q === 1 ? Number.NEGATIVE_INFINITY : (n - j) * Math.log1p(-q)
  return logFactorial(n) - logFactorial(j) - logFactorial(n - j) + successes + failures
}

/** One term of a mixture: the copy number and ln(P(j)·f(j)). */
export interface MixtureTerm { copies: number, logTerm: number }

/** Result of `logMixture`: ln Σ P(j)·f(j) and the terms that entered it. */
export interface LogMixture { logSum: number, terms: MixtureTerm[] }

function logAdd(a: number, b: number): number {
  if (a === Number.NEGATIVE_INFINITY) return b
  if (b === Number.NEGATIVE_INFINITY) return a
  const high = Math.max(a, b)
  return high + Math.log1p(Math.exp(Math.min(a, b) - high))
}

/**
 * ln E[f(J)] = ln Σ_{j ≥ 1} P(J = j)·f(j) for J ~ Binomial(n, q), where f is given in log form
 * and is non-decreasing in j with f ≤ 1 (true of every fixation probability: u(p) grows with
 * the starting frequency p). j = 0 is left out (f(0) = 0 for fixation probabilities).
 *
 * Method: start at the mode of J and walk outwards. Above the mode P falls geometrically with
 * ratio r = P(j+1)/P(j) < 1, so the rest of the sum is at most P(j)·r/(1 − r) (f ≤ 1); below the
 * mode the rest is at most f(j)·P(j)·r′/(1 − r′) with r′ = P(j−1)/P(j) (f non-decreasing). A
 * side stops when its bound falls below `MIXTURE_TOLERANCE` × the running sum. Cost: one f per
 * term kept, at most n.
 *
 * @param n - gene copies 2k, integer ≥ 1
 * @param q - source frequency, in (0, 1]
 * @param logValue - j ↦ ln f(j), non-decreasing, ≤ 0; may return −Infinity
 * @returns ln Σ and the terms kept (unsorted); logSum = −Infinity when every term is 0
 * @example logMixture(2, 0.5, () => 0).logSum  // ln(1 − 0.25) = −0.2876820724517809
 */
export function logMixture(n: number, q: number, logValue: (copies: number) => number): LogMixture {
  const terms: MixtureTerm[] = []
  if (q >= 1) {
    const logTerm = logValue(n)
    terms.push({ copies: n, logTerm })
    return { logSum: logTerm, terms }
  }
  const mode = Math.max(1, Math.min(n, Math.floor((n + 1) * q)))
  const logOdds = Math.log(q) - Math.log1p(-q)
  const logModeProbability = binomialLogProbability(n, mode, q)
  let logSum = Number.NEGATIVE_INFINITY
  const logTolerance = Math.log(MIXTURE_TOLERANCE)

  // Upwards from the mode.
  let logProbability = logModeProbability
  for (let copies = mode; copies <= n; copies++) {
    const logTerm = logProbability + logValue(copies)
    terms.push({ copies, logTerm })
    logSum = logAdd(logSum, logTerm)
    if (copies === n) break
    const logRatio = Math.log(n - copies) - Math.log(copies + 1) + logOdds
    const nextLogProbability = logProbability + logRatio
    if (logRatio < 0) {
      // Remaining Σ_{i > copies} P(i) ≤ P(copies + 1)/(1 − r).
      const bound = nextLogProbability - Math.log1p(-Math.exp(logRatio))
      if (bound < logSum + logTolerance) break
    }
    logProbability = nextLogProbability
  }

  // Downwards from the mode.
  logProbability = logModeProbability
  for (let copies = mode - 1; copies >= 1; copies--) {
    // P(copies) = P(copies + 1)·(copies + 1)/(n − copies)·(1 − q)/q.
    logProbability += Math.log(copies + 1) - Math.log(n - copies) - logOdds
    const logValueHere = logValue(copies)
    const logTerm = logProbability + logValueHere
    terms.push({ copies, logTerm })
    logSum = logAdd(logSum, logTerm)
    const logRatio = Math.log(copies) - Math.log(n - copies + 1) - logOdds
    if (logRatio < 0) {
      const bound = logTerm + logRatio - Math.log1p(-Math.exp(logRatio))
      if (bound < logSum + logTolerance) break
    }
  }
  return { logSum, terms }
}

/**
 * The copies one release carries, for display: P(J = 0) and every j ≥ 1 whose probability is
 * at least 10⁻¹⁵ of the most likely one.
 *
 * @param animalsPerRelease - k, integer ≥ 1
 * @param sourceFrequency - q, in (0, 1]
 * @returns the distribution (mean 2kq, P(none) = (1 − q)^(2k), terms in increasing j)
 * @example copiesDistribution(1, 0.5).terms  // [{ copies: 1, probability: 0.5 }, { copies: 2, probability: 0.25 }]
 */
export function copiesDistribution(animalsPerRelease: number, sourceFrequency: number): CopiesDistribution {
  const geneCopies = 2 * animalsPerRelease
  const q = sourceFrequency
  const mode = q >= 1 ? geneCopies : Math.min(geneCopies, Math.floor((geneCopies + 1) * q))
  const logPeak = binomialLogProbability(geneCopies, mode, q)
  const terms: { copies: number, probability: number }[] = []
  for (let copies = 1; copies <= geneCopies; copies++) {
    const logProbability = binomialLogProbability(geneCopies, copies, q)
    if (logProbability - logPeak >= Math.log(DISPLAY_TOLERANCE)) terms.push({ copies, probability: Math.exp(logProbability) })
  }
  return {
    geneCopies,
    sourceFrequency: q,
    mean: geneCopies * q,
    probabilityNone: Math.exp(binomialLogProbability(geneCopies, 0, q)),
    terms,
  }
}

/**
 * Probability that at least one of several independent releases succeeds, each with
 * probability p: 1 − (1 − p)^releases, computed as −expm1(releases·log1p(−p)) (no cancellation
 * for tiny p).
 *
 * @param singleRelease - p, in [0, 1]
 * @param releases - integer ≥ 0
 * @returns the combined probability, in [0, 1]; 0 for 0 releases
 * @example combineReleases(0.1, 3)  // 0.271 (1 − 0.9³, to rounding)
 */
export function combineReleases(singleRelease: number, releases: number): number {
  if (releases <= 0 || singleRelease <= 0) return 0
  if (singleRelease >= 1) return 1
  return -Math.expm1(releases * Math.log1p(-singleRelease))
}
