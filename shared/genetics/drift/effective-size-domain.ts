import { domainError } from '../validate'

/**
 * Smallest effective size the drift formulas accept.
 *
 * The per-generation retention factor 1 − 1/(2·Ne) is a probability only
 * for Ne ≥ ½: at Ne = ½ every generation is fully inbred (ΔF = 1), and below
 * it the factor turns negative, which has no genetic meaning.
 */
export const MINIMUM_EFFECTIVE_SIZE = 0.5

/**
 * Requires an effective size usable in (1 − 1/(2·Ne))ᵗ: a finite number ≥ ½.
 * Internal to the engine (not re-exported from the barrel).
 */
export function requireEffectiveSize(fn: string, parameter: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < MINIMUM_EFFECTIVE_SIZE) {
    domainError(fn, parameter, `a finite number ≥ ${MINIMUM_EFFECTIVE_SIZE}`, value)
  }
}

/**
 * Natural log of the per-generation retention factor, ln(1 − 1/(2·Ne)),
 * through log1p so that large Ne keeps full relative precision
 * (1 − 1/(2·Ne) rounds to 1 long before its log underflows).
 * Returns −Infinity at Ne = ½. Assumes `effectiveSize` was checked.
 */
export function logRetentionPerGeneration(effectiveSize: number): number {
  return Math.log1p(-1 / (2 * effectiveSize))
}
