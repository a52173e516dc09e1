/**
 * Expected time to establishment (fixation) of a variant that does establish, for a release
 * whose number of copies is random.
 *
 * Method: for j copies the engine gives Kimura & Ohta's (1969) mean time to fixation given
 * fixation, t̄₁(j) (`conditionalFixationTime`, generations, diffusion). Over the copies
 * distribution the mean given establishment weights each j by its share of the establishment
 * probability, w_j ∝ P(J = j)·u(j):  t̄ = Σ w_j·t̄₁(j) / Σ w_j. To keep an update fast the sum
 * uses the most likely copy numbers only (largest w_j first, at most 16, stopping once they
 * hold 99.99% of the weight) and renormalises; t̄₁ changes slowly with j: against the full sum
 * the difference was below 0.03% for releases of 4 to 500 animals (N = 1627, Ne = 346,
 * s = 0.05, h = 0.3), far below the spread of the time itself (SCIENCE.md §3.3).
 *
 * Several releases: the release that establishes the variant is the i-th (i = 0, 1, …) with
 * probability ∝ (1 − P₁)^i·P₁ (P₁ = one release, releases independent — the same
 * approximation as the establishment probability); its expected start is added to give the
 * time from the first release. Years = generations × generation time (SCIENCE.md §10).
 */
import { conditionalFixationTime } from '../genetics'
import type { MixtureTerm } from './copies'
import type { TimeToEstablishment } from './types'

/** At most this many copy numbers enter the mean (see the file comment). */
export const TIME_TERMS_LIMIT = 16
/** Stop adding copy numbers once they hold this share of the weight. */
const TIME_WEIGHT_COVERED = 0.9999

/**
 * Mean time to establishment given establishment.
 *
 * @param terms - the diffusion mixture terms (copy number, ln P(j)·u(j)) of one release
 * @param census - N + k, census after the release (sets p = j/(2(N + k)))
 * @param effectiveSize - Ne
 * @param s - AA selection coefficient
 * @param h - dominance
 * @param singleRelease - P₁, establishment probability of one release
 * @param releaseYears - years of the releases counted (increasing)
 * @param generationTimeYears - L, years per generation
 * @param horizonYears - horizon, years
 * @returns the time, or null when no term has weight
 * @example timeToEstablishment({ terms: [{ copies: 2, logTerm: -1 }], census: 300, effectiveSize: 100, s: 0.05, h: 0.5,
 *   singleRelease: 0.1, releaseYears: [0], generationTimeYears: 3, horizonYears: 500 }).generations
 *   // conditionalFixationTime({ census: 300, effectiveSize: 100, s: 0.05, h: 0.5, copies: 2 }) (one term)
 */
export function timeToEstablishment(args: {
  terms: readonly MixtureTerm[]
  census: number
  effectiveSize: number
  s: number
  h: number
  singleRelease: number
  releaseYears: readonly number[]
  generationTimeYears: number
  horizonYears: number
}): TimeToEstablishment | null {
  const usable = args.terms.filter(term => Number.isFinite(term.logTerm)).sort((a, b) => b.logTerm - a.logTerm)
  const top = usable[0]
  if (!top) return null
  const weights = usable.map(term => ({ copies: term.copies, weight: Math.exp(term.logTerm - top.logTerm) }))
  const total = weights.reduce((sum, term) => sum + term.weight, 0)
  let covered = 0
  let weightedTime = 0
  let usedWeight = 0
  for (const term of weights.slice(0, TIME_TERMS_LIMIT)) {
    const time = conditionalFixationTime({ census: args.census, effectiveSize: args.effectiveSize, s: args.s, h: args.h, copies: term.copies })
    weightedTime += term.weight * time
    usedWeight += term.weight
    covered += term.weight / total
    if (covered >= TIME_WEIGHT_COVERED) break
  }
  const generations = weightedTime / usedWeight
  const first = args.releaseYears[0] ?? 0
  let waitYears = 0
  let norm = 0
  let carry = 1
  for (const year of args.releaseYears) {
    const share = carry * args.singleRelease
    waitYears += share * (year - first)
    norm += share
    carry *= 1 - args.singleRelease
  }
  const expectedWaitYears = norm > 0 ? waitYears / norm : 0
  const years = generations * args.generationTimeYears
  const fromFirstReleaseYears = years + expectedWaitYears
  return {
    generations,
    years,
    fromFirstReleaseGenerations: fromFirstReleaseYears / args.generationTimeYears,
    fromFirstReleaseYears,
    beyondHorizon: first + fromFirstReleaseYears > args.horizonYears,
  }
}
