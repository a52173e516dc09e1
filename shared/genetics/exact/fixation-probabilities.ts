import { requireChainParameters, requireCopies, type ExactChainParameters } from './chain-inputs'
import { solveExactChain } from './chain-solution'

/**
 * Probability that allele A eventually fixes, for every starting number of
 * copies, in the exact Wright–Fisher chain with selection — the check on the
 * diffusion approximation where it is weakest (small N, strong selection,
 * tiny probabilities of deleterious alleles; SCIENCE.md §2).
 *
 * Model (SCIENCE.md §2.1): 2N gene copies; each generation random union of
 * gametes, viability selection with fitnesses AA : Aa : aa = 1+s : 1+h·s : 1,
 * giving p′ = p·[1 + s·(p + h·q)] / w̄ (eq. 2.1), then Binomial(2N, p′)
 * sampling. Fixation probabilities solve u_i = Σ_j P_ij·u_j, u_0 = 0,
 * u_2N = 1 (§2.2).
 * Method: subtraction-free state reduction (Grassmann, Taksar & Heyman 1985)
 * of the banded transition matrix, rows truncated below 10⁻²⁰ (towards fewer
 * copies) and 10⁻³⁰⁰ (towards more; 10⁻⁴⁰ when an a-posteriori error bound
 * allows) of their largest term — see transition-band.ts and
 * chain-solution.ts for why the cutoffs do not affect the result. Only positive
 * numbers are combined, so tiny probabilities keep full relative accuracy:
 * relative error ≤ 2·10⁻¹³ against an untruncated extended-precision
 * reference down to u ≈ 6·10⁻²⁸⁹, a few ulps against exact rationals.
 * Values below ~10⁻³⁰⁸ lose digits and then underflow to 0.
 * Assumptions: a Wright–Fisher population is its own Ne, so Ne = census;
 * constant N, s and h; one locus; no migration or mutation after the start.
 * Cost (one core): ~0.1 s for census 1000 and ~0.3 s for census 2000;
 * strongly deleterious alleles, which need the full upper cutoff, take
 * ~0.2 s and ~0.8 s (bench/exact-chain.bench.ts).
 * Reference: Grassmann WK, Taksar MI, Heyman DP (1985) Operations Research
 *   33:1107–1116; model as in SCIENCE.md §2.
 *
 * @param census - N, diploid breeding adults (= Ne), integer in [1, 5000]
 * @param s - selection coefficient of AA, per generation, 1 + s > 0
 * @param h - dominance of A (0 recessive, ½ additive, 1 dominant), 1 + h·s > 0
 * @returns Float64Array of length 2N + 1: entry k is u for k starting copies
 *   (entry 0 is 0, entry 2N is 1), non-decreasing in k
 * @throws RangeError if an argument is outside its domain
 * @example exactFixationProbabilities({ census: 1, s: 0.5, h: 0.5 })  // Float64Array [0, 0.599009900990099, 1] (= 121/202)
 * @example exactFixationProbabilities({ census: 10, s: 0.1, h: 0.5 })[1]  // 0.1076479404087937
 * @example exactFixationProbabilities({ census: 2, s: 0, h: 0.5 })  // [0, 0.25, 0.5, 0.75, 1] (neutral: u = p, to rounding)
 */
export function exactFixationProbabilities({ census, s, h }: ExactChainParameters): Float64Array {
  requireChainParameters('exactFixationProbabilities', { census, s, h })
  return solveExactChain(census, s, h, false).fixation
}

/**
 * Probability that an allele introduced as `copies` gene copies eventually
 * fixes, from the exact Wright–Fisher chain with selection. Same model, method
 * and accuracy as `exactFixationProbabilities` (one full solve per call; use
 * that function when several starting numbers are needed).
 *
 * @param census - N, diploid breeding adults (= Ne), integer in [1, 5000]
 * @param s - selection coefficient of AA, per generation, 1 + s > 0
 * @param h - dominance of A, 1 + h·s > 0
 * @param copies - k, gene copies of A at the start, integer in [0, 2N]
 * @returns u in [0, 1]; 0 for k = 0, 1 for k = 2N
 * @throws RangeError if an argument is outside its domain
 * @example exactFixationProbability({ census: 5, s: 0.5, h: 1, copies: 1 })  // 0.460517579452… (diffusion: 0.553)
 * @example exactFixationProbability({ census: 1000, s: -0.01, h: 0.5, copies: 1 })  // 1.88843391469…e-11
 * @example exactFixationProbability({ census: 50, s: 0.1, h: 0.5, copies: 0 })  // 0
 * @example exactFixationProbability({ census: 50, s: 0.1, h: 0.5, copies: 100 })  // 1
 */
export function exactFixationProbability({ census, s, h, copies }: ExactChainParameters & { copies: number }): number {
  const fn = 'exactFixationProbability'
  const geneCopies = requireChainParameters(fn, { census, s, h })
  requireCopies(fn, copies, geneCopies)
  if (copies === 0) return 0
  if (copies === geneCopies) return 1
  return solveExactChain(census, s, h, false).fixation[copies] ?? 0
}
