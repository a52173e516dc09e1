import { requireChainParameters, requireCopies, type ExactChainParameters } from './chain-inputs'
import { solveExactChain } from './chain-solution'

/**
 * Mean number of generations until fixation, for alleles that do fix, for
 * every starting number of copies, from the exact Wright–Fisher chain with
 * selection — the exact counterpart of Kimura & Ohta's diffusion formula
 * (SCIENCE.md §3.1), which is 14–16% short at s = 0.5 (§3.3).
 *
 * Formula: the chain conditioned on fixation has transitions P_ij·u_j/u_i
 * (u from `exactFixationProbabilities`); its mean absorption time t̄₁ solves
 * t̄₁(i) = 1 + Σ_j P_ij·(u_j/u_i)·t̄₁(j). Multiplying by u_i, w = u·t̄₁ solves
 * (I − Q)·w = u, a second subtraction-free solve with the same state
 * reduction (Grassmann, Taksar & Heyman 1985). Relative error ≤ 10⁻¹⁴
 * against the exact-rational and extended-precision references (which reach
 * u ≈ 10⁻²⁸⁵); not guaranteed once u falls below ~10⁻³⁰⁸.
 * Assumptions: as for `exactFixationProbabilities` (Ne = census).
 * Units: generations.
 * Reference: Kimura M, Ohta T (1969) Genetics 61:763–771 (quantity);
 *   Grassmann, Taksar & Heyman (1985) Operations Research 33:1107–1116 (method).
 *
 * @param census - N, diploid breeding adults (= Ne), integer in [1, 5000]
 * @param s - selection coefficient of AA, per generation, 1 + s > 0
 * @param h - dominance of A, 1 + h·s > 0
 * @returns Float64Array of length 2N + 1, generations: entry k is t̄₁ for k
 *   starting copies; entry 2N is 0; entry 0 — and any entry whose fixation
 *   probability underflows to 0 — is NaN (fixation impossible, time undefined)
 * @throws RangeError if an argument is outside its domain
 * @example exactConditionalFixationTimes({ census: 1, s: 0, h: 0.5 })  // Float64Array [NaN, 2, 0]
 * @example exactConditionalFixationTimes({ census: 100, s: 0, h: 0.5 })[1]  // 396.511413… (diffusion 398.998)
 */
export function exactConditionalFixationTimes({ census, s, h }: ExactChainParameters): Float64Array {
  requireChainParameters('exactConditionalFixationTimes', { census, s, h })
  return conditionalTimes(census, s, h)
}

/**
 * Mean number of generations until fixation of an allele introduced as
 * `copies` gene copies, given that it fixes, from the exact Wright–Fisher
 * chain with selection. Same model and method as
 * `exactConditionalFixationTimes` (one full solve per call).
 *
 * @param census - N, diploid breeding adults (= Ne), integer in [1, 5000]
 * @param s - selection coefficient of AA, per generation, 1 + s > 0
 * @param h - dominance of A, 1 + h·s > 0
 * @param copies - k, gene copies of A at the start, integer in [1, 2N]
 * @returns t̄₁ in generations, ≥ 0 (0 when k = 2N); NaN only if the
 *   fixation probability underflows to 0 (below ~10⁻³²³)
 * @throws RangeError if an argument is outside its domain (k = 0 included:
 *   an absent allele cannot fix)
 * @example exactConditionalFixationTime({ census: 100, s: 0.5, h: 0.5, copies: 1 })  // 47.0988… (diffusion 40.38)
 * @example exactConditionalFixationTime({ census: 1000, s: 0.01, h: 0.5, copies: 1 })  // 1409.807…
 * @example exactConditionalFixationTime({ census: 10, s: 0.1, h: 0.5, copies: 20 })  // 0
 */
export function exactConditionalFixationTime({ census, s, h, copies }: ExactChainParameters & { copies: number }): number {
  const fn = 'exactConditionalFixationTime'
  const geneCopies = requireChainParameters(fn, { census, s, h })
  requireCopies(fn, copies, geneCopies, 1)
  if (copies === geneCopies) return 0
  return conditionalTimes(census, s, h)[copies] ?? Number.NaN
}

function conditionalTimes(census: number, s: number, h: number): Float64Array {
  const geneCopies = 2 * census
  const { fixation, fixationWeightedTime } = solveExactChain(census, s, h, true)
  const times = new Float64Array(geneCopies + 1)
  times[0] = Number.NaN
  for (let i = 1; i < geneCopies; i++) {
    const probability = fixation[i] ?? 0
    times[i] = probability > 0 ? (fixationWeightedTime?.[i] ?? 0) / probability : Number.NaN
  }
  return times
}
