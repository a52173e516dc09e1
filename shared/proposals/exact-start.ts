/**
 * The exact Wright–Fisher chain for a proposal: a population of M = round(Ne) individuals
 * whose starting frequency of the variant is set by the census.
 *
 * Decision (documented here and in explanations.ts): the engine's exact chain represents a
 * population that *is* its own effective size (SCIENCE.md §2.2). A recipient usually has
 * Ne well below its census, and running the chain at the census would understate drift by
 * the factor N/Ne. We therefore run the chain at M = round(Ne) — the drift the diffusion
 * also uses — and start it from the census frequency p = j / (2(N + k)) of the released
 * copies, through one generation of the chain's own step: viability selection (SCIENCE.md
 * eq. 2.1) at p, then Binomial(2M, p′) sampling into a state i of the chain, whose fixation
 * probability U_i the engine gives. So
 *
 *     u_exact(p) = Σ_i Binomial(2M, p′)(i) · U_i,   p′ = p·[1 + s(p + h(1 − p))] / w̄,
 *     w̄ = 1 + s·p² + 2h·s·p(1 − p).
 *
 * This is the same model as the stochastic simulation (census sets the starting frequency and
 * the dilution, Ne sets the sampling) and, when N + k = M and p is a whole number of copies,
 * it is exactly the engine's U_j (the chain's own equation U_j = Σ_i P_ji U_i). When Ne < N it
 * is the labelled approximation SCIENCE.md §2.2 names ("a chain of size round(Ne) started at
 * frequency k/(2N)"), with 2Ne rounded to an even number of genes.
 */
import { logMixture } from './copies'

/** Largest M = round(Ne) for which the exact chain is offered (SCIENCE.md §2.2; issue 6). */
export const EXACT_CHAIN_LIMIT = 2000

/**
 * Supplies the engine's fixation-probability vector U (length 2M + 1) for a chain, or null
 * when it is not ready yet (the browser computes large chains in a worker).
 */
export type ExactVectorProvider = (chain: { census: number, s: number, h: number }) => Float64Array | null

/**
 * Frequency after one round of viability selection (SCIENCE.md eq. 2.1).
 *
 * @param p - frequency of A before selection, in [0, 1]
 * @param s - AA selection coefficient, 1 + s > 0
 * @param h - dominance, 1 + h·s > 0
 * @returns p′, in [0, 1]
 * @example selectedFrequency(0.5, 0, 0.5)  // 0.5
 * @example selectedFrequency(0.1, 0.1, 0.5) // 0.10473933649289099 (= 0.1·1.055/1.0073)
 */
export function selectedFrequency(p: number, s: number, h: number): number {
  const meanFitness = 1 + s * p * p + 2 * h * s * p * (1 - p)
  return Math.min(1, Math.max(0, (p * (1 + s * (p + h * (1 - p)))) / meanFitness))
}

/**
 * ln u_exact for a starting frequency that need not be a whole number of the chain's genes.
 *
 * @param vector - U from `exactFixationProbabilities({ census: M, s, h })`, length 2M + 1
 * @param startFrequency - p = copies / (2·census after release), in (0, 1]
 * @param s - AA selection coefficient
 * @param h - dominance
 * @returns ln u, ≤ 0 (−Infinity when 0)
 * @example Math.exp(logExactFromFrequency(exactFixationProbabilities({ census: 10, s: 0.1, h: 0.5 }), 1 / 20, 0.1, 0.5))
 *   // 0.10764794040879372 (= U₁, SCIENCE.md §11 row 16: 0.107647940409)
 */
export function logExactFromFrequency(vector: Float64Array, startFrequency: number, s: number, h: number): number {
  const geneCopies = vector.length - 1
  const selected = selectedFrequency(startFrequency, s, h)
  if (selected <= 0) return Number.NEGATIVE_INFINITY
  return logMixture(geneCopies, selected, state => Math.log(vector[state] ?? 0)).logSum
}
