import { domainError, requireFinite, requireInteger, requirePositive } from '../validate'

/**
 * Inputs shared by the fixation functions (SCIENCE.md §0 conventions).
 * Fitnesses: AA = 1 + s, Aa = 1 + h·s, aa = 1.
 */
export interface SelectionInputs {
  /** N, census number of breeding diploid adults, integer ≥ 1. */
  census: number
  /** Ne, effective population size per generation, individuals, > 0. */
  effectiveSize: number
  /** s, selection coefficient of the AA homozygote per generation; 1 + s > 0. */
  s: number
  /** h, dominance of A (0 recessive, ½ additive, 1 dominant); any real with 1 + h·s > 0. */
  h: number
}

/** Selection inputs plus k, the number of A gene copies introduced (0 ≤ k ≤ 2N). */
export interface FixationInputs extends SelectionInputs {
  copies: number
}

/**
 * Largest accepted selection strength 2·Ne·|s|·(1 + 2|h|). Far beyond any
 * biological input (realistic values stay below 10⁶); the cap only keeps the
 * squared slopes used by the quadrature finite in double precision.
 */
export const MAXIMUM_SELECTION_STRENGTH = 1e100

/**
 * Checks census, effective size, s and h against the engine's domain and
 * throws the standard RangeError otherwise. Internal to the fixation module.
 */
export function requireSelectionInputs(fn: string, inputs: SelectionInputs): void {
  const { census, effectiveSize, s, h } = inputs
  requireInteger(fn, 'census', census, 1)
  requirePositive(fn, 'effectiveSize', effectiveSize)
  requireFinite(fn, 's', s)
  if (!(1 + s > 0)) domainError(fn, 's', 'such that 1 + s > 0 (AA fitness positive)', s)
  requireFinite(fn, 'h', h)
  if (!(1 + h * s > 0)) domainError(fn, 'h', `such that 1 + h·s > 0 (Aa fitness positive; s = ${s})`, h)
  const strength = 2 * effectiveSize * Math.abs(s) * (1 + 2 * Math.abs(h))
  if (!(strength <= MAXIMUM_SELECTION_STRENGTH)) {
    domainError(fn, 's', `such that 2·effectiveSize·|s|·(1 + 2|h|) ≤ ${MAXIMUM_SELECTION_STRENGTH}`, s)
  }
}

/** Checks k: an integer with `minimum` ≤ k ≤ 2·census. Call after `requireSelectionInputs`. */
export function requireCopies(fn: string, census: number, copies: number, minimum: number): void {
  requireInteger(fn, 'copies', copies, minimum)
  if (copies > 2 * census) domainError(fn, 'copies', `at most 2·census = ${2 * census}`, copies)
}

/**
 * Coefficients of the exponent of Kimura's G(x) = exp(−(linear·x + quadratic·x²)):
 * linear = 4·Ne·s·h and quadratic = 2·Ne·s·(1 − 2h) (SCIENCE.md §1.1–1.2).
 * For h = ½ the quadratic coefficient is exactly 0.
 */
export interface DiffusionExponent {
  linear: number
  quadratic: number
}

/** Builds the exponent coefficients from Ne, s and h (inputs already checked). */
export function diffusionExponent(effectiveSize: number, s: number, h: number): DiffusionExponent {
  const scaledSelection = 2 * effectiveSize * s
  return { linear: 2 * h * scaledSelection, quadratic: (1 - 2 * h) * scaledSelection }
}
