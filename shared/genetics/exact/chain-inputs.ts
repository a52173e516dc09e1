import { domainError, requireFinite, requireInteger } from '../validate'

/**
 * Largest census size the exact chain accepts. Work grows as N² (2N states
 * times two band widths that grow as √N; a dense solve would grow as N³):
 * see bench/exact-chain.bench.ts for figures. Census 5000 needs ~250 MB and
 * several seconds; beyond it use the diffusion (SCIENCE.md §1), which is
 * accurate there for the s values that matter (SCIENCE.md §2.3).
 */
export const MAXIMUM_EXACT_CENSUS = 5000

/** The parameters shared by every exact-chain function (SCIENCE.md §0). */
export interface ExactChainParameters {
  /** N, breeding diploid adults (= Ne in the exact chain), integer in [1, MAXIMUM_EXACT_CENSUS] */
  census: number
  /** s, selection coefficient of the AA homozygote, per generation, 1 + s > 0 */
  s: number
  /** h, dominance of A, real, 1 + h·s > 0 */
  h: number
}

/**
 * Checks census, s and h and returns the number of gene copies 2N.
 * Throws the engine's standard RangeError (validate.ts) on bad input.
 */
export function requireChainParameters(fn: string, { census, s, h }: ExactChainParameters): number {
  requireInteger(fn, 'census', census, 1)
  if (census > MAXIMUM_EXACT_CENSUS) domainError(fn, 'census', `an integer ≤ ${MAXIMUM_EXACT_CENSUS}`, census)
  requireFinite(fn, 's', s)
  requireFinite(fn, 'h', h)
  if (!(1 + s > 0)) domainError(fn, 's', 'a finite number with 1 + s > 0', s)
  if (!(1 + h * s > 0) || !Number.isFinite(h * s)) domainError(fn, 'h', 'a finite number with 1 + h·s > 0', h)
  return 2 * census
}

/** Checks that `copies` is an integer in [minimum, 2N]. */
export function requireCopies(fn: string, copies: number, geneCopies: number, minimum = 0): void {
  if (typeof copies !== 'number' || !Number.isInteger(copies) || copies < minimum || copies > geneCopies) {
    domainError(fn, 'copies', `an integer in [${minimum}, ${geneCopies}]`, copies)
  }
}
