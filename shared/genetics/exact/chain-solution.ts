import { reduceStates, solveReduced } from './state-reduction'
import {
  buildTransitionBand, FAST_UPPER_TAIL_CUTOFF, LOWER_TAIL_CUTOFF, STORAGE_SCALE, UPPER_TAIL_CUTOFF,
  type TransitionBand,
} from './transition-band'

/**
 * Largest accepted bound on (error from the fast upper cutoff) / u_i. Tiny,
 * so that the conditional times (which weigh errors by up to ~4N) are also
 * untouched.
 */
export const FAST_PASS_TOLERANCE = 1e-20

/** The fast pass is tried unless the allele is clearly strongly deleterious. */
function fastPassWorthTrying(census: number, s: number): boolean {
  return s >= 0 || census * -s <= 20
}

/** A reduced band, its pivots and the fixation probabilities it gives. */
export interface Factorised { band: TransitionBand, pivot: Float64Array, fixation: Float64Array }

/** Builds the band with the given upper cutoff, reduces it and solves for u. */
export function factoriseAndSolve(geneCopies: number, s: number, h: number, upperCutoff: number): Factorised {
  const band = buildTransitionBand(geneCopies, s, h, LOWER_TAIL_CUTOFF, upperCutoff)
  const pivot = reduceStates(band)
  const fixation = solveReduced(band, pivot, new Float64Array(geneCopies + 1), 1)
  return { band, pivot, fixation }
}

/**
 * Bound on |u_i − ũ_i| caused by the probability cut above each row's mode.
 * With u the untruncated solution and ũ the truncated one, u − ũ = G̃·e where
 * G̃ = (I − Q̃)⁻¹ ≥ 0 is the truncated chain's Green's function and the
 * upper-tail part of e_k, Σ_dropped P_kj·(u_j − u_k), lies in [−m_k, m_k]
 * with m_k = droppedAbove[k]; so |u − ũ| ≤ G̃·m: one more cheap solve with
 * the same factorisation. (The lower-tail part is bounded a priori, see
 * transition-band.ts.)
 */
export function upperTruncationBound({ band, pivot }: Factorised): Float64Array {
  return solveReduced(band, pivot, band.droppedAbove.slice(), 0)
}

function upperTruncationNegligible(factorised: Factorised): boolean {
  const bound = upperTruncationBound(factorised)
  for (let i = 1; i < factorised.band.geneCopies; i++) {
    if (!((bound[i] ?? 0) <= FAST_PASS_TOLERANCE * (factorised.fixation[i] ?? 0))) return false
  }
  return true
}

/**
 * Fixation probabilities u_0..u_n of the exact Wright–Fisher chain with
 * selection, and optionally E[T·1{fixation}] for every start (one band
 * factorisation serves both solves). n = 2N gene copies; inputs are assumed
 * validated by the caller.
 *
 * u solves u = P·u with u_0 = 0, u_n = 1 (SCIENCE.md §2.2). The rows are
 * first cut at FAST_UPPER_TAIL_CUTOFF above the mode (about 2.5× less work)
 * unless the allele is strongly deleterious; that result is kept only if
 * `upperTruncationBound` proves the cut negligible (≤ 10⁻²⁰·u_i), else the chain is rebuilt with the
 * full UPPER_TAIL_CUTOFF (transition-band.ts).
 *
 * The second solve uses (I − Q)·w = u: w_i = Σ_k G_ik·u_k = E_i[T·1{fix}],
 * because u(X_t) = P(fix | X_t); so t̄₁(i) = w_i / u_i, which is exactly the
 * mean absorption time of the chain conditioned on fixation (transitions
 * P_ij·u_j/u_i): multiplying t̂_i = 1 + Σ_j P_ij·(u_j/u_i)·t̂_j by u_i gives
 * the same equation for w = u·t̂. Both right-hand sides are positive, so the
 * solve stays subtraction-free.
 */
export function solveExactChain(census: number, s: number, h: number, withTimes: boolean): {
  fixation: Float64Array
  fixationWeightedTime: Float64Array | undefined
} {
  const geneCopies = 2 * census
  let solved: Factorised | undefined
  if (fastPassWorthTrying(census, s)) {
    const attempt = factoriseAndSolve(geneCopies, s, h, FAST_UPPER_TAIL_CUTOFF)
    if (upperTruncationNegligible(attempt)) solved = attempt
  }
  solved ??= factoriseAndSolve(geneCopies, s, h, UPPER_TAIL_CUTOFF)
  const { band, pivot, fixation } = solved
  if (!withTimes) return { fixation, fixationWeightedTime: undefined }
  const reward = new Float64Array(geneCopies + 1)
  for (let i = 1; i < geneCopies; i++) reward[i] = (fixation[i] ?? 0) * STORAGE_SCALE
  return { fixation, fixationWeightedTime: solveReduced(band, pivot, reward, 0) }
}
